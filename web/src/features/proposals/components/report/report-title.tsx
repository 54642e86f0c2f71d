import type { ReactNode } from 'react';
import { StateBadge } from '../../../../components/ui/state-badge';
import type { Proposal } from '#shared/api/proposals';
import { currentDesign, currentDesignName, currentDesignRole } from '#shared/workflow/current-design';
import { formatDateTime } from '../../../../lib/dates';

function Item({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="contents">
      <dt className="text-ink-soft dark:text-night-ink-soft">{term}</dt>
      <dd className="min-w-0">{children}</dd>
    </div>
  );
}

/**
 * The report's title block: the product, the proposal, its spec version, its state, the engine
 * and rule-set versions, when it was ranked and when this report was generated, and the notice.
 */
export function ReportTitle({ proposal, projectName, generatedAt, notice, onlineHref, actions }: { proposal: Proposal; projectName: string | null; generatedAt: Date; notice: string; onlineHref: string; actions?: ReactNode }) {
  const current = currentDesign(proposal.result, proposal.decisions);
  return (
    <header className="report-title space-y-4">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          <p className="text-xs font-medium tracking-wide text-fern uppercase dark:text-fern-bright">Longtail · review report</p>
          <h1 id="report-heading" className="mt-1 text-2xl font-medium tracking-tight">
            Proposal #{proposal.id}: {proposal.specVersion.title}
          </h1>
        </div>
        {actions && <div className="flex flex-wrap items-center gap-2 print:hidden">{actions}</div>}
      </div>
      <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-sm sm:grid-cols-[max-content_1fr_max-content_1fr] print:grid-cols-[max-content_1fr_max-content_1fr]">
        <Item term="Product">Longtail tail-current-source sizing</Item>
        <Item term="Project">{projectName ?? `project #${proposal.projectId}`}</Item>
        <Item term="Proposal">
          #{proposal.id}{' '}
          <a href={onlineHref} data-print-url className="text-fern underline dark:text-fern-bright">
            proposal page
          </a>
        </Item>
        <Item term="Spec">
          {proposal.specVersion.title}, version {proposal.specVersion.version}
        </Item>
        <Item term="State">
          <StateBadge state={proposal.status} />
        </Item>
        <Item term="Design">
          {current ? (
            <>
              {currentDesignName(current)} <span className="text-ink-soft dark:text-night-ink-soft">({currentDesignRole(current, proposal.status).toLowerCase()})</span>
            </>
          ) : (
            'none (no option passes every blocking check, nothing decided)'
          )}
        </Item>
        <Item term="Ranked">{formatDateTime(proposal.createdAt, { seconds: true })}</Item>
        <Item term="Engine">version {proposal.engineVersion}</Item>
        <Item term="Rule set">
          <code className="font-mono text-xs break-all">{proposal.rulesetVersion}</code>
        </Item>
        <Item term="Generated">{formatDateTime(generatedAt.toISOString(), { seconds: true })}</Item>
      </dl>
      <p className="report-notice flex items-start gap-2 rounded-md border border-rule bg-paper px-3 py-2 text-sm dark:border-night-rule dark:bg-night">
        <span aria-hidden="true" className="font-semibold">
          i
        </span>
        <span>
          <span className="font-medium">Estimates. </span>
          {notice}
        </span>
      </p>
    </header>
  );
}
