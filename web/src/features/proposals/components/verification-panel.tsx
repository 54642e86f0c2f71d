import { useQuery } from '@tanstack/react-query';
import type { ProposalVerificationResult, VerificationJobView } from '#shared/verification/types';
import { mayAs } from '#shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import type { Proposal } from '#shared/api/proposals';
import type { User } from '#shared/api/users';
import { useVerifyMutation } from '../api/verification-mutations';
import { isSettled, verificationQuery } from '../../../lib/verification-queries';
import { proposalCurrentDesign } from '../lib/current-design';
import { currentDesignName, currentDesignWord } from '#shared/workflow/current-design';
import { DesignCheckNote } from './verification/freshness-label';
import { JobProblem } from './verification/job-problem';
import { JobProgress } from './verification/job-progress';
import { MonteCarloSection } from './verification/monte-carlo-section';
import { MutationError } from './verification/mutation-error';
import { VerificationResult } from './verification/verification-result';
import { WithdrawJob } from './verification/withdraw-job';

function isProposalResult(result: VerificationJobView['result']): result is ProposalVerificationResult {
  return result !== null && 'options' in result;
}

/**
 * The SPICE check of a proposal: every ranked option (and a designer's own values) simulated in
 * ngspice on the netlists this page exports, each figure set beside the engine's with its
 * tolerance; and, for a differential output, a Monte Carlo of mismatch in SPICE. Designers and
 * reviewers may ask for either; everyone who sees the proposal reads the results. The status is
 * polled once a second only while a job is waiting or simulating.
 */
export function VerificationPanel({ proposal, user }: { proposal: Proposal; user: User }) {
  const status = useQuery(verificationQuery(proposal.id));
  const mutation = useVerifyMutation(proposal.id);
  const canVerify = mayAs(user, proposal.projectId, 'proposals:verify');
  const current = proposalCurrentDesign(proposal);
  const job = status.data?.verification ?? null;
  const running = job !== null && !isSettled(job);
  const troubled = job !== null && (job.state === 'stopped' || job.state === 'failed' || job.state === 'withdrawn');
  const label = mutation.isPending
    ? 'Asking…'
    : running
      ? 'Simulating…'
      : troubled
        ? 'Run the SPICE check again'
        : job
          ? 'Run every option through SPICE again'
          : 'Run every option through SPICE';
  const action = canVerify ? (
    <Button variant={job && !troubled ? 'secondary' : 'primary'} onClick={() => mutation.mutate()} disabled={running || mutation.isPending || status.isPending}>
      {label}
    </Button>
  ) : undefined;

  return (
    <Sheet title="SPICE check" aria-label="SPICE check" actions={troubled ? undefined : action}>
      <div className="space-y-4">
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">
          Each option’s exported netlist simulated in ngspice, nominal and at every corner, set beside the engine’s figures with the tolerance each is held to. Agreement shows the
          engine solved the model it describes; both remain estimates to confirm by bench measurement.
        </p>
        {mutation.isError && <MutationError error={mutation.error} what="The SPICE check was not started" />}
        {current && status.data?.currentDesign && !running && (
          <DesignCheckNote
            state={status.data.currentDesign}
            designName={currentDesignName(current)}
            word={currentDesignWord(current)}
            onRun={() => mutation.mutate()}
            running={running || mutation.isPending}
            canVerify={canVerify}
          />
        )}
        {status.isPending ? (
          <Loading what="Loading the SPICE check" />
        ) : status.isError ? (
          <ErrorPanel error={status.error} retry={() => void status.refetch()} />
        ) : !job ? (
          <EmptyState title="Not simulated yet">
            {canVerify ? 'Run every option through SPICE to compare the engine’s figures with ngspice’s.' : 'A designer or reviewer can ask for a SPICE check of every option.'}
          </EmptyState>
        ) : running ? (
          <JobProgress job={job} label="Every option" withdraw={<WithdrawJob proposalId={proposal.id} projectId={proposal.projectId} job={job} user={user} what="the SPICE check of every option" />} />
        ) : job.state !== 'finished' ? (
          <JobProblem job={job} what="The SPICE check" action={action} />
        ) : isProposalResult(job.result) ? (
          <VerificationResult job={job} result={job.result} proposal={proposal} />
        ) : (
          <p className="text-sm text-ink-soft dark:text-night-ink-soft">This check finished without a result.</p>
        )}
        {!status.isPending && !status.isError && <MonteCarloSection proposal={proposal} status={status.data} canVerify={canVerify} user={user} />}
      </div>
    </Sheet>
  );
}
