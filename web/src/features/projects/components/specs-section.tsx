import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { paths } from '../../../config/paths';
import type { Spec } from '#shared/api/specs';
import { DenseTable, rowLink, Td, Th, Tr } from '../../../components/ui/dense-table';
import { When } from '../../../components/ui/when';

/** The project's requirement specs, newest change first; "New spec" for those who write specs. */
export function SpecsSection({ projectId, specs, canWrite }: { projectId: number; specs: readonly Spec[]; canWrite: boolean }) {
  const sorted = [...specs].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt));
  return (
    <Sheet
      title="Specs"
      aria-label="Specs"
      actions={
        canWrite && (
          <>
            <Link
              to={paths.specImport.href(projectId)}
              className="rounded-md border border-rule px-3 py-1.5 text-sm font-medium hover:bg-paper dark:border-night-rule dark:hover:bg-night"
            >
              Import specs
            </Link>
            <Link
              to={paths.newSpec.href(projectId)}
              className="rounded-md bg-fern px-3 py-1.5 text-sm font-medium text-sheet hover:bg-fern/90"
            >
              New spec
            </Link>
          </>
        )
      }
    >
      {sorted.length === 0 ? (
        <EmptyState title="No specs yet">
          {canWrite ? 'Write the first requirement spec for this project.' : 'A systems engineer writes the requirement specs; they appear here.'}
        </EmptyState>
      ) : (
        <DenseTable caption="Specs of this project">
          <thead>
            <tr>
              <Th>Title</Th>
              <Th className="text-right">Version</Th>
              <Th>Updated</Th>
            </tr>
          </thead>
          <tbody>
            {sorted.map((spec) => (
              <Tr key={spec.id}>
                <Td>
                  <Link to={paths.spec.href(spec.id)} className={rowLink}>
                    {spec.title}
                  </Link>
                </Td>
                <Td className="text-right tabular-nums">v{spec.latestVersion}</Td>
                <Td className="text-ink-soft dark:text-night-ink-soft">
                  <When iso={spec.updatedAt} />
                </Td>
              </Tr>
            ))}
          </tbody>
        </DenseTable>
      )}
    </Sheet>
  );
}
