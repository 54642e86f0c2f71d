import { OptionVerdict } from '../../../../components/ui/verdict';
import type { Decision, Proposal } from '#shared/api/proposals';
import { CheckList } from '../review/check-list';
import { When } from '../audit/when';
import { blockingFailures, decidedOption, decisionKindWords, rankedOption } from './decided-option';
import { DesignValues } from './design-values';
import { topologyName } from '../../../../lib/topology-names';

/**
 * One decision, read-only: who decided what and when, the reason, the values, and for an
 * override the server's verdict on them with every check (unless shown elsewhere on the page).
 */
export function DecisionSummary({ proposal, decision, nameOf, showChecks = true }: { proposal: Proposal; decision: Decision; nameOf: (id: number | null) => string; showChecks?: boolean }) {
  const option = decidedOption(proposal, decision);
  const ranked = rankedOption(proposal, decision.topology);
  const failures = option ? blockingFailures(option) : 0;
  const number = proposal.decisions.findIndex((d) => d.id === decision.id) + 1;
  return (
    <article className="space-y-3" aria-label={`Decision ${number}`}>
      <p className="text-sm">
        <span className="font-medium">{nameOf(decision.decidedById)}</span> {decisionKindWords(decision.kind, proposal)}: <span className="font-medium">{topologyName(decision.topology)}</span>
        {decision.kind === 'choose' && ranked && (
          <span className="text-ink-soft dark:text-night-ink-soft">
            {' '}
            (ranked #{ranked.rank} of {proposal.result.options.length})
          </span>
        )}
        <span className="text-ink-soft dark:text-night-ink-soft">
          {' '}
          · <When iso={decision.createdAt} />
          {proposal.decisions.length > 1 && ` · decision ${number} of ${proposal.decisions.length}`}
        </span>
      </p>
      {option && (
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <OptionVerdict option={{ passes: option.passes, blockingShortCount: failures }} form="sentence" />
          <span className="text-ink-soft dark:text-night-ink-soft">{decision.kind === 'override' ? 'as checked by the server with every rule' : 'as ranked by the engine'}</span>
        </p>
      )}
      <figure>
        <figcaption className="text-xs text-ink-soft dark:text-night-ink-soft">Reason</figcaption>
        {decision.reason ? <blockquote className="mt-0.5 border-l-2 border-fern pl-3 text-sm whitespace-pre-line">{decision.reason}</blockquote> : <p className="text-sm text-ink-soft dark:text-night-ink-soft">None given (accepting needs none).</p>}
      </figure>
      <DesignValues design={decision.design} compareWith={decision.kind === 'override' ? ranked?.design : null} />
      {decision.kind === 'override' && showChecks && option && <CheckList checks={option.checks} caption="The server’s checks of these values" />}
      {decision.kind === 'override' && !option && <p className="text-sm text-ink-soft">The server kept no evaluation with this decision.</p>}
    </article>
  );
}
