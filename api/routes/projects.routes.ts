/** Projects, their members, and the project-scoped lists (specs, proposals). */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { addMember, createProject, listMembers, listProjects, projectFor, removeMember } from '../services/projects.service';
import { listProposals } from '../services/proposals.service';
import { createSpec, listSpecs } from '../services/specs.service';
import { MEMBERSHIP_BODY, NEW_PROJECT_BODY, PROPOSAL_LIST_QUERY, SPEC_BODY } from '../validation/bodies';
import { idParam, validateBody, validateQuery } from '../validation/validate-request';

export function projectsRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/', async (req, res) => {
    res.json({ items: await listProjects(dataSource, currentUser(req)) });
  });
  router.post('/', requirePermission('projects:create'), validateBody(NEW_PROJECT_BODY), async (req, res) => {
    res.status(201).json(await createProject(dataSource, currentUser(req).id, req.body));
  });
  router.get('/:id', async (req, res) => {
    res.json(await projectFor(dataSource, currentUser(req), idParam(req.params.id, 'project')));
  });
  router.get('/:id/members', async (req, res) => {
    res.json({ items: await listMembers(dataSource, currentUser(req), idParam(req.params.id, 'project')) });
  });
  router.post('/:id/members', requirePermission('members:manage'), validateBody(MEMBERSHIP_BODY), async (req, res) => {
    res.status(201).json(await addMember(dataSource, currentUser(req), idParam(req.params.id, 'project'), req.body.userId, req.body.role));
  });
  router.delete('/:id/members/:userId', requirePermission('members:manage'), async (req, res) => {
    await removeMember(dataSource, currentUser(req), idParam(req.params.id, 'project'), idParam(req.params.userId, 'member'));
    res.status(204).end();
  });
  router.get('/:id/specs', async (req, res) => {
    res.json({ items: await listSpecs(dataSource, currentUser(req), idParam(req.params.id, 'project')) });
  });
  router.post('/:id/specs', requirePermission('specs:write'), validateBody(SPEC_BODY), async (req, res) => {
    res.status(201).json(await createSpec(dataSource, currentUser(req), idParam(req.params.id, 'project'), req.body));
  });
  router.get('/:id/proposals', validateQuery(PROPOSAL_LIST_QUERY), async (req, res) => {
    res.json(await listProposals(dataSource, currentUser(req), idParam(req.params.id, 'project'), res.locals.query));
  });
  return router;
}
