/**
 * The text of every notification, in one place: plain text, our own words. Each message names
 * the proposal (or the spec), the spec title and version, the project, who did what and their
 * reason or comment (or a SPICE check's outcome), links to the page, and ends with the estimates notice. Subjects carry only our
 * words and numbers: user text (titles, names, comments) stays in the body, never in a header.
 * A digest puts several messages to one person into one. Pure: no I/O.
 */
import { topologyName } from '#shared/engine/topologies';
import { ESTIMATE_NOTICE } from '#shared/engine/version';
import { commentLines, singleLine } from '#shared/text/plain-text';
import type { DecisionKind } from '../entities/decision.entity';
import { currentDesignName, currentDesignSummary } from '#shared/workflow/current-design';
import type { NoticeKind } from '#shared/workflow/notices';
import type { MonteCarloVerificationResult, ProposalVerificationResult, VerificationKind } from '#shared/verification/types';

/** The kinds of notice (their names, titles and descriptions: shared/workflow/notices.ts). */
export type NotificationKind = NoticeKind;

/** What every message says about the work it is about. */
export interface WorkFacts {
  projectName: string;
  specTitle: string;
  specVersion: number;
  /** The page the message points to (the proposal's, or the spec's history). */
  link: string;
  /** The profile page, where a person turns notices off. */
  profileLink: string;
}

/** What every message about a proposal says. */
export interface ProposalFacts extends WorkFacts {
  proposalId: number;
}

/** A settled SPICE check or Monte Carlo as a notice tells it: what ran and how it ended. */
export interface VerificationJobFacts {
  id: number;
  kind: VerificationKind;
  state: 'finished' | 'failed';
  /** Why it could not run (a failed job), in the queue's words. */
  message: string | null;
  result: ProposalVerificationResult | MonteCarloVerificationResult | null;
}

export interface DecisionFacts {
  kind: DecisionKind;
  topology: string;
  /** The engine's recommendation (null when no option passed). */
  recommended: string | null;
  reason: string | null;
  /** For an override: whether the own design holds every blocking check. */
  passes?: boolean;
  decidedBy: string;
}

export type MessageFacts =
  | (ProposalFacts & { kind: 'proposal.ready'; rankedBy: string; recommended: string | null })
  | (ProposalFacts & { kind: 'proposal.decided'; decision: DecisionFacts; decisionNumber: number })
  | (ProposalFacts & {
      kind: 'proposal.approved' | 'proposal.returned';
      reviewedBy: string;
      comment: string | null;
      decision: DecisionFacts;
      /** A sign-off: the SPICE verification job it relied on (null: none about the design), and whether that job simulated another design. */
      verification?: { jobId: number | null; staleAccepted: boolean };
      /** A send-back: the comment threads still open, each with its anchor in words. */
      openComments?: { id: number; anchor: string; author: string; body: string }[];
    })
  /** A comment or reply on the proposal: who wrote it, where it hangs (in words), the text. */
  | (ProposalFacts & { kind: 'proposal.commented'; commentedBy: string; anchor: string; reply: boolean; body: string })
  /** The facts of the newer proposal, and the older ones it closed. */
  | (ProposalFacts & { kind: 'proposal.superseded'; rankedBy: string; closed: { proposalId: number; specVersion: number; link: string }[] })
  /** A new version of a spec (`specVersion` is the new one): who saved it, their note, how many fields changed since the version before. */
  | (WorkFacts & { kind: 'spec.new-version'; savedBy: string; note: string | null; changes: number })
  /** A SPICE check or Monte Carlo settled: told to whoever asked for it. */
  | (ProposalFacts & { kind: 'verification.ended'; job: VerificationJobFacts });

export interface ComposedMessage {
  subject: string;
  text: string;
}

/** A topology as the app names it ("Degenerated mirror"). */
const tail = (topology: string) => topologyName(topology);

/** One line saying what the designer settled on. */
export function decisionSentence(decision: DecisionFacts): string {
  switch (decision.kind) {
    case 'accept':
      return `accepted the recommended tail, ${tail(decision.topology)}`;
    case 'choose':
      return decision.recommended
        ? `chose ${tail(decision.topology)} instead of the recommended ${tail(decision.recommended)}`
        : `chose ${tail(decision.topology)} (no option passed every blocking check)`;
    case 'override': {
      const check = decision.passes === undefined ? '' : decision.passes ? '; its full check holds every blocking check' : '; its full check falls short of a blocking check';
      return `overrode the ranking with own values (${tail(decision.topology)})${check}`;
    }
  }
}

/** The design itself, named first: "Cascode mirror, own values" (shared/workflow/current-design.ts). */
export function designLine(label: string, decision: DecisionFacts): string[] {
  const summary = currentDesignSummary(decision.recommended, { id: 0, kind: decision.kind, topology: decision.topology, reason: decision.reason });
  if (!summary) return [];
  const beside = summary.differsFromRecommendation ? ` (the engine recommended ${decision.recommended ? `the ${tail(decision.recommended)}` : 'nothing'})` : '';
  return [`${label}: ${currentDesignName(summary)}${beside}`];
}

function verificationLine(verification: { jobId: number | null; staleAccepted: boolean } | undefined): string[] {
  if (!verification) return [];
  if (verification.jobId === null) return ['SPICE verification relied on: none (nothing about this design was simulated).'];
  if (verification.staleAccepted) return [`SPICE verification relied on: job #${verification.jobId}, which simulated another design; the reviewer accepted it and says why in the comment.`];
  return [`SPICE verification relied on: job #${verification.jobId}, which simulated exactly this design.`];
}

/** A send-back's open comment threads: each one's anchor, author and text, indented. */
function openCommentLines(open: { id: number; anchor: string; author: string; body: string }[] | undefined): string[] {
  if (!open || open.length === 0) return [];
  return [
    `Open comments (${open.length}):`,
    ...open.flatMap((c) => [`  #${c.id} on ${singleLine(c.anchor)}, by ${singleLine(c.author)}:`, ...commentLines(c.body, '    ')]),
  ];
}

/** How a message's project and spec lines start (a digest lists them under each entry). */
const PROJECT_LABEL = 'Project: ';
const SPEC_LABEL = 'Spec: ';
const specLine = (facts: WorkFacts) => `${SPEC_LABEL}"${facts.specTitle}", version ${facts.specVersion}`;
const projectLine = (facts: WorkFacts) => `${PROJECT_LABEL}${facts.projectName}`;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const jobName = (job: VerificationJobFacts) => (job.kind === 'monte-carlo' ? `SPICE Monte Carlo #${job.id}` : `SPICE check #${job.id}`);

/**
 * How a settled job came out: the end of one sentence ("… finished: …", the message's summary) and the lines under it. A
 * whole-proposal check: how many options agree with the engine within the tolerances, differ or
 * could not be simulated, and each option's verdict; a Monte Carlo: the share of runs that meet
 * the required rejection; a failed job: why it could not run.
 */
export function verificationOutcome(job: VerificationJobFacts): { sentence: string; lines: string[] } {
  if (job.state === 'failed' || !job.result) return { sentence: 'could not run, so nothing was simulated.', lines: [] };
  if ('options' in job.result) {
    const options = job.result.options;
    const errors = options.filter((o) => o.outcome === 'error').length;
    const agreeing = options.filter((o) => o.outcome === 'verified' && o.agrees).length;
    const differing = options.length - errors - agreeing;
    const parts = [`${agreeing} ${agreeing === 1 ? 'agrees' : 'agree'} with the engine within the tolerances`, ...(differing > 0 ? [`${differing} ${differing === 1 ? 'differs' : 'differ'}`] : []), ...(errors > 0 ? [`${errors} could not be simulated`] : [])];
    return {
      sentence: `finished: ${plural(options.length, 'option', 'options')} simulated; ${parts.join(', ')}.`,
      lines: options.map((o) => {
        const name = `${tail(o.topology)}${o.source === 'decision' ? ' (own values)' : ''}`;
        if (o.outcome === 'error') return `  ${name}: could not be simulated (${singleLine(o.error ?? 'no reason given')})`;
        return `  ${name}: ${o.agrees ? 'agrees within the tolerances' : `${plural(o.disagreements, 'figure', 'figures')} outside the tolerances`}`;
      }),
    };
  }
  const mc = job.result;
  const { yieldPercent, percentilesDb } = mc.simulated;
  return {
    sentence: `finished: ${yieldPercent.toFixed(1)} % of ${mc.runs} runs of the ${tail(mc.topology)} meet the required ${mc.requiredDb} dB rejection.`,
    lines: [
      `  Condition simulated: ${singleLine(mc.condition)}`,
      `  Rejection over the runs: 5th percentile ${percentilesDb.p5.toFixed(1)} dB, median ${percentilesDb.p50.toFixed(1)} dB, 95th percentile ${percentilesDb.p95.toFixed(1)} dB`,
      ...(mc.failedRuns > 0 ? [`  ${plural(mc.failedRuns, 'run', 'runs')} did not converge and are left out`] : []),
    ],
  };
}
/** Multi-line user text (a reason, a comment): indented, one line each, control characters blanked. */
const quoted = (label: string, text: string | null) => (text ? [`${label}:`, ...commentLines(text, '  ')] : []);

/** The facts with every one-line user text (titles, names) on one line, control characters and bidi controls blanked. */
function plainFacts(facts: MessageFacts): MessageFacts {
  const common = { ...facts, projectName: singleLine(facts.projectName), specTitle: singleLine(facts.specTitle) };
  if (common.kind === 'verification.ended') return common;
  if (common.kind === 'spec.new-version') return { ...common, savedBy: singleLine(common.savedBy) };
  if (common.kind === 'proposal.ready' || common.kind === 'proposal.superseded') return { ...common, rankedBy: singleLine(common.rankedBy) };
  if (common.kind === 'proposal.commented') return { ...common, commentedBy: singleLine(common.commentedBy), anchor: singleLine(common.anchor) };
  const decision = { ...common.decision, decidedBy: singleLine(common.decision.decidedBy) };
  if (common.kind === 'proposal.decided') return { ...common, decision };
  return { ...common, decision, reviewedBy: singleLine(common.reviewedBy) };
}

/**
 * Subject and text of one message to one person; `because` says why they get it. User text is
 * data: titles and names stay on one line and out of the subject (a mail header), reasons and comments
 * are indented line by line, every control character and bidi control blanked.
 */
export function composeMessage(unsafeFacts: MessageFacts, unsafeRecipientName: string, because: string): ComposedMessage {
  const facts = plainFacts(unsafeFacts);
  const recipientName = singleLine(unsafeRecipientName);
  const name = 'proposalId' in facts ? `proposal #${facts.proposalId}` : '';
  const spec = `spec version ${facts.specVersion}`;
  let subject: string;
  let body: string[];
  switch (facts.kind) {
    case 'proposal.ready':
      subject = `Proposal #${facts.proposalId} waits for a decision (${spec})`;
      body = [
        `${facts.rankedBy} had the tail options ranked, and ${name} now waits for a designer's decision.`,
        '',
        projectLine(facts),
        specLine(facts),
        facts.recommended ? `Recommended tail: ${tail(facts.recommended)}` : 'Recommended: nothing (no option passes every blocking check); choose an option with a reason, or override.',
        '',
        `Accept, choose or override: ${facts.link}`,
      ];
      break;
    case 'proposal.decided':
      subject = `Proposal #${facts.proposalId} decided, waiting for review (${spec})`;
      body = [
        `${facts.decision.decidedBy} decided ${name}: ${decisionSentence(facts.decision)}.`,
        ...(facts.decisionNumber > 1 ? [`This is decision ${facts.decisionNumber} on it, after it was sent back for rework.`] : []),
        '',
        ...designLine('Decided design', facts.decision),
        projectLine(facts),
        specLine(facts),
        ...quoted('Reason', facts.decision.reason),
        '',
        `Sign it off, or send it back for rework with a comment: ${facts.link}`,
      ];
      break;
    case 'proposal.approved':
      subject = `Proposal #${facts.proposalId} signed off (${spec})`;
      body = [
        `${facts.reviewedBy} signed off ${name}.`,
        ...designLine('Signed-off design', facts.decision),
        `The decision signed off: ${facts.decision.decidedBy} ${decisionSentence(facts.decision)}.`,
        ...verificationLine(facts.verification),
        '',
        projectLine(facts),
        specLine(facts),
        ...quoted('Designer’s reason', facts.decision.reason),
        ...quoted('Review comment', facts.comment),
        '',
        `The signed-off design and its figures: ${facts.link}`,
      ];
      break;
    case 'proposal.returned':
      subject = `Proposal #${facts.proposalId} sent back for rework (${spec})`;
      body = [
        `${facts.reviewedBy} sent ${name} back for rework; it waits for a new decision.`,
        ...designLine('Design sent back', facts.decision),
        `The decision sent back: ${facts.decision.decidedBy} ${decisionSentence(facts.decision)}.`,
        '',
        projectLine(facts),
        specLine(facts),
        ...quoted('Review comment', facts.comment),
        ...openCommentLines(facts.openComments),
        '',
        `The review and the proposal: ${facts.link}`,
      ];
      break;
    case 'proposal.commented':
      subject = `Proposal #${facts.proposalId}: a new ${facts.reply ? 'reply' : 'comment'} (${spec})`;
      body = [
        `${facts.commentedBy} ${facts.reply ? 'replied to a comment on' : 'commented on'} ${facts.anchor} in ${name}.`,
        '',
        projectLine(facts),
        specLine(facts),
        ...quoted(facts.reply ? 'Reply' : 'Comment', facts.body),
        '',
        `Read the thread, reply or resolve it: ${facts.link}`,
      ];
      break;
    case 'spec.new-version':
      subject = `New version ${facts.specVersion} of a spec you ranked`;
      body = [
        `${facts.savedBy} saved version ${facts.specVersion} of a spec you had ranked; ${plural(facts.changes, 'field differs', 'fields differ')} from version ${facts.specVersion - 1}.`,
        '',
        projectLine(facts),
        specLine(facts),
        ...quoted('Change note', facts.note),
        '',
        `What changed, and ranking the new version: ${facts.link}`,
      ];
      break;
    case 'verification.ended': {
      const outcome = verificationOutcome(facts.job);
      subject = `${jobName(facts.job)} ${facts.job.state === 'finished' ? 'finished' : 'could not run'} (proposal #${facts.proposalId}, ${spec})`;
      body = [
        `The ${jobName(facts.job)} you asked for on ${name} ${outcome.sentence}`,
        ...outcome.lines,
        ...(facts.job.state === 'failed' ? quoted('Why', facts.job.message) : []),
        '',
        projectLine(facts),
        specLine(facts),
        '',
        `${facts.job.state === 'finished' ? 'The figures beside the engine’s' : 'The proposal, to ask for it again'}: ${facts.link}`,
      ];
      break;
    }
    case 'proposal.superseded': {
      const many = facts.closed.length > 1;
      subject = `${many ? `${facts.closed.length} proposals` : `Proposal #${facts.closed[0]?.proposalId}`} closed: the spec moved on to version ${facts.specVersion}`;
      body = [
        `${facts.rankedBy} had version ${facts.specVersion} of the spec ranked (${name}). ${many ? 'These proposals of older versions were' : 'This proposal of an older version was'} still waiting for a decision and ${many ? 'are' : 'is'} now closed as superseded:`,
        '',
        ...facts.closed.map((c) => `  #${c.proposalId} (spec version ${c.specVersion}): ${c.link}`),
        '',
        projectLine(facts),
        specLine(facts),
        '',
        `Decide on the newer version instead: ${facts.link}`,
      ];
      break;
    }
  }
  const text = [
    `Hello ${recipientName},`,
    '',
    ...body,
    '',
    `You get this e-mail because ${because}. Turn this kind of e-mail (or all of them) off on your profile: ${facts.profileLink}`,
    '',
    ESTIMATE_NOTICE,
    '',
  ].join('\n');
  return { subject: subject.length > 300 ? `${subject.slice(0, 299)}…` : subject, text };
}

/**
 * Messages to one person beyond this many within DIGEST_WINDOW_MS are held and go out together
 * as one digest at the end of the window: nobody gets a burst of e-mails from one busy minute.
 */
export const DIGEST_AFTER = 3;
export const DIGEST_WINDOW_MS = 60_000;

/** One held message as the digest lists it: what happened (the message's subject line and opening line) and its page. */
export interface DigestEntry {
  subject: string;
  /** The message's first sentence after the greeting (who did what). */
  summary: string;
  /** The message's project and spec lines ("Project: …", "Spec: "…", version 2"): which work it is about. */
  about?: readonly string[];
  link: string | null;
}

/** A listed line stays one line: control characters, separators and bidi controls blanked. */
const oneLine = (text: string) => singleLine(text).trim();

/** The sentence that says what happened: the body's first line after the greeting. */
export function summaryOf(body: string): string {
  const lines = body.split('\n');
  return oneLine(lines.find((line, i) => i > 0 && line.trim() !== '') ?? '');
}

/**
 * The project and spec lines of a message, after its summary sentence (so a name that happens to
 * start like one is not taken for it): what a digest entry needs besides the subject, which
 * carries no titles.
 */
export function aboutOf(body: string): string[] {
  const lines = body.split('\n');
  const summaryAt = lines.findIndex((line, i) => i > 0 && line.trim() !== '');
  const rest = summaryAt < 0 ? [] : lines.slice(summaryAt + 1);
  return [rest.find((line) => line.startsWith(PROJECT_LABEL)), rest.find((line) => line.startsWith(SPEC_LABEL))].filter((line): line is string => line !== undefined).map(oneLine);
}

/** One e-mail for several held messages to one person, each with what it is about and its link; the subject is ours alone. */
export function composeDigest(entries: readonly DigestEntry[], recipientName: string, profileLink: string): ComposedMessage {
  const items = entries.flatMap((entry, i) => [
    `${i + 1}. ${oneLine(entry.subject)}`,
    ...(entry.summary ? [`   ${entry.summary}`] : []),
    ...(entry.about ?? []).map((line) => `   ${oneLine(line)}`),
    ...(entry.link ? [`   ${oneLine(entry.link)}`] : []),
    '',
  ]);
  const text = [
    `Hello ${oneLine(recipientName)},`,
    '',
    entries.length === 1 ? 'One more workflow update came for you within the same minute as the ones before it:' : `${entries.length} workflow updates came for you within about a minute, so here they are in one e-mail:`,
    '',
    ...items,
    `You get these e-mails because you work on these projects. Turn them off on your profile: ${profileLink}`,
    '',
    ESTIMATE_NOTICE,
    '',
  ].join('\n');
  return { subject: `Longtail: ${entries.length} workflow update${entries.length === 1 ? '' : 's'}`, text };
}
