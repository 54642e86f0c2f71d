/** The header and role check the pages that write a project's specs share (a new spec, an import). */
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { mayAs, projectRoleOf, ROLE_TITLES } from '#shared/workflow/roles';
import { EmptyState } from '../../../components/ui/feedback';
import { PageHeader } from '../../../components/ui/page-header';
import { paths } from '../../../config/paths';
import type { Project } from '#shared/api/projects';
import type { SessionUser } from '#shared/api/users';

/** The page's header under a link back to its project. */
export function ProjectPageHeader({ project, title, children }: { project: Pick<Project, 'id' | 'name'>; title: string; children?: ReactNode }) {
  const eyebrow = (
    <Link to={paths.project.href(project.id)} className="hover:underline">
      {project.name}
    </Link>
  );
  return (
    <PageHeader eyebrow={eyebrow} title={title}>
      {children}
    </PageHeader>
  );
}

/** `children` for someone whose role in the project may write specs; for anyone else the header and why there is nothing to do here. */
export function SpecWritersOnly({ user, project, title, refusal, children }: { user: SessionUser; project: Pick<Project, 'id' | 'name'>; title: string; refusal: string; children: ReactNode }) {
  if (mayAs(user, project.id, 'specs:write')) return children;
  const roleHere = projectRoleOf(user.projectRoles, project.id);
  return (
    <>
      <ProjectPageHeader project={project} title={title} />
      <EmptyState title={refusal}>
        {roleHere ? `Your role in this project is ${ROLE_TITLES[roleHere].toLowerCase()}` : 'You hold no role in this project'}; you can read its specs and, where your role allows, rank them.
      </EmptyState>
    </>
  );
}
