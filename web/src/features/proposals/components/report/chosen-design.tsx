import { OptionVerdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { topologyName, topologyNameInText } from '../../../../lib/topology-names';
import { blockingFailures, decisionKindWords } from '../decision/decided-option';
import { OptionSchematic } from '../ranking/schematic/option-schematic';
import { SizedValues } from '../ranking/sized-values';
import { RejectionLimits } from '../ranking/rejection-limits';
import type { ReportSubject } from '../../lib/report-subject';
import { besideRecommendation, currentDesign, currentDesignName, currentDesignRole } from '#shared/workflow/current-design';
import { formatDateTime } from '../../../../lib/dates';

const BASIS_WORDS = {
  recommendation: 'No decision yet. Shown below: the recommendation, as the engine sized it.',
  'top-ranked': 'No decision yet, and no option passes every blocking check. Shown below: the top-ranked option, as the engine sized it.',
  none: 'No decision yet, and the ranking holds no option.',
} as const;

/** The design the report is about: who decided what, when and why, the reviews of it, its schematic and sized values. */
export function ChosenDesign({ proposal, subject, nameOf }: { proposal: Proposal; subject: ReportSubject; nameOf: (id: number | null) => string }) {
  const { decision, option, design } = subject;
  const payload = proposal.specVersion.payload;
  const reviews = decision ? proposal.reviews.filter((r) => r.decisionId === decision.id) : [];
  const failures = option ? blockingFailures(option) : 0;
  const current = currentDesign(proposal.result, proposal.decisions);
  const beside = current ? besideRecommendation(current) : null;
  return (
    <div className="space-y-4">
      {current && (
        <div className="text-sm" data-testid="report-design">
          <p>
            <span className="text-ink-soft dark:text-night-ink-soft">{currentDesignRole(current, proposal.status)}: </span>
            <span className="text-base font-medium">{currentDesignName(current)}</span>
          </p>
          {beside && <p className="mt-0.5">{beside}</p>}
        </div>
      )}
      {decision ? (
        <div className="space-y-2 text-sm">
          <p>
            <span className="font-medium">{nameOf(decision.decidedById)}</span> {decisionKindWords(decision.kind, proposal)}: <span className="font-medium">{topologyName(decision.topology)}</span>
            {' '}· {formatDateTime(decision.createdAt, { seconds: true })}
            {proposal.decisions.length > 1 && ` · decision ${proposal.decisions.length} of ${proposal.decisions.length}`}
          </p>
          <div>
            <p className="text-xs text-ink-soft dark:text-night-ink-soft">Reason</p>
            {decision.reason ? (
              <blockquote className="mt-0.5 border-l-2 border-fern pl-3 whitespace-pre-line">{decision.reason}</blockquote>
            ) : (
              <p className="text-ink-soft dark:text-night-ink-soft">None given (accepting the recommendation needs none).</p>
            )}
          </div>
          {reviews.map((review) => (
            <div key={review.id}>
              <p>
                <span className="font-medium">{nameOf(review.reviewerId)}</span> {review.verdict === 'approve' ? 'signed off this decision' : 'sent this decision back for rework'} · {formatDateTime(review.createdAt, { seconds: true })}
              </p>
              {review.verdict === 'approve' && review.verificationJobId !== undefined && (
                <p className="text-xs text-ink-soft dark:text-night-ink-soft">
                  {review.verificationJobId === null
                    ? 'Relied on no SPICE verification of this design.'
                    : review.staleVerificationAccepted
                      ? `Relied on SPICE job #${review.verificationJobId}, which simulated another design (accepted in the comment).`
                      : `Relied on SPICE job #${review.verificationJobId}, which simulated exactly this design.`}
                </p>
              )}
              {review.comment && <blockquote className="mt-0.5 border-l-2 border-rule pl-3 whitespace-pre-line dark:border-night-rule">{review.comment}</blockquote>}
            </div>
          ))}
        </div>
      ) : (
        <p className="text-sm font-medium">{BASIS_WORDS[subject.basis as keyof typeof BASIS_WORDS]}</p>
      )}
      {option && (
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <OptionVerdict option={{ passes: option.passes, blockingShortCount: failures }} form="sentence" />
          <span className="text-ink-soft dark:text-night-ink-soft">
            {decision?.kind === 'override' ? 'as the server checked the designer’s values with every rule' : `as ranked by the engine (rank ${option.rank} of ${proposal.result.options.length})`}
          </span>
        </p>
      )}
      {decision?.kind === 'override' && !option && <p className="text-sm text-ink-soft dark:text-night-ink-soft">The server kept no evaluation with this decision.</p>}
      {design ? (
        // Printed, the drawing sits above the values: side by side, a drawing that may not break would push both to the next page.
        <div className="grid gap-6 md:grid-cols-2 print:grid-cols-1 print:gap-3">
          <figure className="report-keep min-w-0">
            <OptionSchematic design={design} className="mx-auto w-full max-w-[480px] print:max-w-[95mm]" />
            <figcaption className="mt-1 text-center text-xs text-ink-soft dark:text-night-ink-soft">
              The stage with the {topologyNameInText(design.tail.topology)} tail, as sized; the tail element in the accent colour.
            </figcaption>
          </figure>
          <SizedValues design={design} series={payload?.resistors?.series ?? null} tolerancePercent={payload?.resistors?.tolerancePercent ?? null} facts={option?.figures ?? null} predicted={option?.predicted ?? null} />
        </div>
      ) : (
        subject.option && <p className="text-sm">This option could not be sized{subject.option.error ? `: ${subject.option.error}` : '.'}</p>
      )}
      {option?.rejectionLimits && option.rejectionLimits.limits.length > 0 && (
        <section className="report-keep" aria-labelledby="report-rejection-limits-title">
          <h3 id="report-rejection-limits-title" className="mb-1 text-sm font-medium">
            What limits the rejection at the spec frequency
          </h3>
          <RejectionLimits option={option} />
        </section>
      )}
    </div>
  );
}
