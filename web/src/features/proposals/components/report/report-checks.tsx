import type { Check } from '#shared/engine/types';
import { checkVerdict, Verdict } from '../../../../components/ui/verdict';
import type { Proposal } from '#shared/api/proposals';
import { topologyName } from '../../../../lib/topology-names';
import { CheckList, marginText } from '../review/check-list';
import { checkTitle, isCaution } from '../../../../lib/checks';
import { otherOptions, type ReportSubject } from '../../lib/report-subject';
import { ReportSubheading } from './report-section';

const SUBJECT_WORDS = { decision: 'the decided design', recommendation: 'the recommendation (no decision yet)', 'top-ranked': 'the top-ranked option (no decision yet)', none: '' } as const;

/** A check that came out against the option (blocking or advisory, undecided included), cautions aside. */
const failed = (check: Check) => !check.passed && check.applicable !== false && !isCaution(check);

/** Every check of the subject, then the failed checks of each other ranked option, compactly. */
export function ReportChecks({ proposal, subject }: { proposal: Proposal; subject: ReportSubject }) {
  const option = subject.option;
  const others = otherOptions(proposal, subject);
  return (
    <div>
      {option && subject.topology ? (
        <>
          <ReportSubheading>
            Every check of {topologyName(subject.topology)}, {SUBJECT_WORDS[subject.basis]}
          </ReportSubheading>
          <CheckList checks={option.checks} caption={`${topologyName(subject.topology)}: ${option.checks.length} checks`} />
        </>
      ) : (
        <p className="text-sm">{subject.decision ? 'The server kept no checks with this decision.' : 'No option to check.'}</p>
      )}
      {others.length > 0 && (
        // Kept whole on paper when it fits, so its heading never ends a page alone.
        <div className="report-keep mt-5">
          <ReportSubheading>Failed checks of the other options</ReportSubheading>
          <p className="mb-2 text-xs text-ink-soft dark:text-night-ink-soft">Margins are + on the safe side. Cautions apply to every option and are listed once, under Cautions.</p>
          <ul className="space-y-2 text-sm">
            {others.map((other) => {
              const failures = other.checks.filter(failed);
              return (
                <li key={other.topology} className="report-keep">
                  <span className="font-medium">
                    #{other.rank} {topologyName(other.topology)}
                  </span>
                  {other.error ? (
                    <span> — could not be solved ({other.error}); every check undecided.</span>
                  ) : failures.length === 0 ? (
                    <span> — no failed check.</span>
                  ) : (
                    <ul className="mt-0.5 ml-4 space-y-0.5">
                      {failures.map((check) => (
                        <li key={check.rule} className="flex flex-wrap items-baseline gap-x-2">
                          <Verdict kind={checkVerdict(check)} />
                          <span>{checkTitle(check)}</span>
                          <span className="text-ink-soft tabular-nums dark:text-night-ink-soft">{marginText(check)}</span>
                        </li>
                      ))}
                    </ul>
                  )}
                </li>
              );
            })}
          </ul>
        </div>
      )}
    </div>
  );
}
