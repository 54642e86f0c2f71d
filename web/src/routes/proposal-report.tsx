/**
 * The review report of one proposal: one page meant to be printed or saved as PDF (print styles
 * in styles/app.css). Title block, cautions, the spec, the ranking, the chosen design, its
 * checks, the plots (static SVG, so they print), the SPICE verification, the bench measurements, the comment threads, the audit trail and the sources, with
 * the estimates notice.
 */
import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ESTIMATE_NOTICE } from '#shared/engine/version';
import { RouteError } from '../components/layout/route-error';
import { Button } from '../components/ui/button';
import { paths } from '../config/paths';
import { projectQuery } from '../features/projects/api/project-queries';
import { proposalAuditQuery, proposalPeopleQuery, proposalQuery } from '../features/proposals/api/proposal-queries';
import { usePersonName } from '../features/proposals/components/audit/use-person-name';
import { reportVerificationQuery } from '../features/proposals/api/report-queries';
import { ChosenDesign } from '../features/proposals/components/report/chosen-design';
import { RankedOptions } from '../features/proposals/components/report/ranked-options';
import { ReportAudit } from '../features/proposals/components/report/report-audit';
import { ReportCautions } from '../features/proposals/components/report/report-cautions';
import { ReportChecks } from '../features/proposals/components/report/report-checks';
import { DesignMonteCarlo, RankingPlot } from '../features/proposals/components/report/report-plots';
import { ReportSection } from '../features/proposals/components/report/report-section';
import { ReportSources } from '../features/proposals/components/report/report-sources';
import { ReportTitle } from '../features/proposals/components/report/report-title';
import { ReportVerification } from '../features/proposals/components/report/report-verification';
import { ReportMeasurements } from '../features/proposals/components/report/report-measurements';
import { MEASUREMENT_MAX_PAGE_SIZE, measurementsQuery } from '../features/measurements/api/measurement-queries';
import { SpecTable } from '../features/specs/components/spec-table';
import { reportSubject } from '../features/proposals/lib/report-subject';
import { commentsQuery } from '../features/proposals/api/comment-queries';
import { ReportComments } from '../features/proposals/components/report/report-comments';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const proposalId = Number(params.proposalId);
    const proposal = await queryClient.ensureQueryData(proposalQuery(proposalId));
    // The rest is fetched before the page shows, so a print straight away has it all; a failure
    // shows in its own section rather than stopping the report.
    await Promise.all([
      queryClient.prefetchQuery(proposalAuditQuery(proposalId)),
      queryClient.prefetchQuery(commentsQuery(proposalId)),
      queryClient.prefetchQuery(reportVerificationQuery(proposalId)),
      queryClient.prefetchQuery(measurementsQuery(proposalId, 1, MEASUREMENT_MAX_PAGE_SIZE)),
      queryClient.prefetchQuery(projectQuery(proposal.projectId)),
      queryClient.prefetchQuery(proposalPeopleQuery(proposal.projectId)),
    ]);
    return null;
  };

const LINK_BUTTON =
  'inline-flex items-center rounded-md border border-rule bg-sheet px-3.5 py-2 text-sm font-medium hover:bg-paper dark:border-night-rule dark:bg-night-sheet dark:hover:bg-night';

export function Component() {
  const proposalId = Number(useParams().proposalId);
  const { data: proposal } = useSuspenseQuery(proposalQuery(proposalId));
  const audit = useQuery(proposalAuditQuery(proposalId));
  const comments = useQuery(commentsQuery(proposalId));
  const verification = useQuery(reportVerificationQuery(proposalId));
  const measurements = useQuery(measurementsQuery(proposalId, 1, MEASUREMENT_MAX_PAGE_SIZE));
  const project = useQuery(projectQuery(proposal.projectId));
  const nameOf = usePersonName(proposal.projectId);
  const [generatedAt] = useState(() => new Date());
  const subject = reportSubject(proposal);
  const onlineHref = new URL(paths.proposal.href(proposal.id), window.location.origin).href;
  let section = 0;
  const next = () => ++section;

  return (
    <article aria-labelledby="report-heading" className="report-page mx-auto max-w-4xl space-y-6 rounded-lg border border-rule bg-sheet p-6 sm:p-8 dark:border-night-rule dark:bg-night-sheet">
      <ReportTitle
        proposal={proposal}
        projectName={project.data?.name ?? null}
        generatedAt={generatedAt}
        notice={proposal.result.notice || ESTIMATE_NOTICE}
        onlineHref={onlineHref}
        actions={
          <>
            <Button onClick={() => window.print()}>Print or save as PDF</Button>
            <Link to={paths.proposal.href(proposal.id)} className={LINK_BUTTON}>
              Back to the proposal
            </Link>
          </>
        }
      />
      <ReportSection id="report-cautions" number={next()} title="Cautions">
        <ReportCautions cautions={proposal.result.cautions} />
      </ReportSection>
      <ReportSection id="report-spec" number={next()} title="Requirement spec">
        <SpecTable payload={proposal.specVersion.payload} title={proposal.specVersion.title} version={proposal.specVersion.version} />
      </ReportSection>
      <ReportSection id="report-ranking" number={next()} title="Ranked options">
        <RankedOptions proposal={proposal} decided={subject.decision ? { topology: subject.decision.topology, ownValues: subject.decision.kind === 'override' } : null} />
        <RankingPlot proposal={proposal} subject={subject} />
      </ReportSection>
      <ReportSection id="report-design" number={next()} title="Chosen design">
        <ChosenDesign proposal={proposal} subject={subject} nameOf={nameOf} />
        <div className="mt-5">
          <DesignMonteCarlo subject={subject} monteCarlo={verification.data?.monteCarlo} />
        </div>
      </ReportSection>
      <ReportSection id="report-checks" number={next()} title="Checks">
        <ReportChecks proposal={proposal} subject={subject} />
      </ReportSection>
      <ReportSection id="report-verification" number={next()} title="SPICE verification">
        <ReportVerification proposal={proposal} status={verification.data} error={verification.error} />
      </ReportSection>
      <ReportSection id="report-measurements" number={next()} title="Bench measurements">
        <ReportMeasurements items={measurements.data ? [...measurements.data.items].reverse() : undefined} error={measurements.error} />
      </ReportSection>
      <ReportSection id="report-comments" number={next()} title="Comments">
        <ReportComments proposal={proposal} threads={comments.data?.items} error={comments.error} />
      </ReportSection>
      <ReportSection id="report-audit" number={next()} title="Audit trail">
        <ReportAudit proposal={proposal} events={audit.data?.items} error={audit.error} nameOf={nameOf} />
      </ReportSection>
      <ReportSection id="report-sources" number={next()} title="Sources of the formulas">
        <ReportSources />
      </ReportSection>
      <footer className="report-footer border-t border-rule pt-3 text-xs dark:border-night-rule">
        <p>
          <span className="font-medium">Estimates. </span>
          {ESTIMATE_NOTICE}
        </p>
        <p className="mt-1 text-ink-soft dark:text-night-ink-soft">
          Longtail review report of proposal #{proposal.id}, {proposal.specVersion.title} version {proposal.specVersion.version}.
        </p>
      </footer>
    </article>
  );
}

export const ErrorBoundary = RouteError;
