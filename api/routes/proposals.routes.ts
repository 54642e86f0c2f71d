/** One proposal: read it, check own values, decide, review, withdraw, its comment threads, its audit trail, and its exports (CSV, JSON, SPICE netlist). */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { RuleSet } from '#shared/engine/types';
import { validateDesign } from '#shared/validate';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { invalid } from '../errors';
import { decide, evaluateOverride, getProposal, proposalAudit, review, withdraw } from '../services/proposals.service';
import { proposalExport, proposalNetlist, proposalRankingCsv } from '../services/proposal-exports.service';
import { COMMENT_BODY, DECISION_BODY, EVALUATION_BODY, MONTE_CARLO_BODY, NETLIST_QUERY, REPLY_BODY, REVIEW_BODY, THREAD_STATE_BODY, WITHDRAWAL_BODY } from '../validation/bodies';
import { listComments, postComment, replyToComment, setThreadState } from '../services/comments.service';
import { requestMonteCarlo, requestVerification, verificationStatus, withdrawJob } from '../services/verification.service';
import type { VerificationQueue } from '../verification/verification-queue';
import { idParam, validateBody, validateQuery } from '../validation/validate-request';

export function proposalsRoutes(dataSource: DataSource, ruleSet: RuleSet, verification: VerificationQueue): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/:id', async (req, res) => {
    res.json(await getProposal(dataSource, currentUser(req), idParam(req.params.id, 'proposal')));
  });
  router.post('/:id/decision', requirePermission('proposals:decide'), validateBody(DECISION_BODY), async (req, res) => {
    res.status(201).json(await decide(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body, ruleSet));
  });
  router.post('/:id/evaluation', requirePermission('proposals:decide'), validateBody(EVALUATION_BODY), async (req, res) => {
    const checked = validateDesign(req.body.design);
    if (!checked.ok) throw invalid(checked.errors.map((e) => ({ path: `/design${e.path}`, message: e.message })));
    res.json(await evaluateOverride(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), checked.value, ruleSet));
  });
  router.post('/:id/review', requirePermission('proposals:review'), validateBody(REVIEW_BODY), async (req, res) => {
    res.status(201).json(await review(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body));
  });
  router.post('/:id/withdrawal', requirePermission('proposals:withdraw'), validateBody(WITHDRAWAL_BODY), async (req, res) => {
    res.status(201).json(await withdraw(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body));
  });
  router.get('/:id/ranking.csv', async (req, res) => {
    const { fileName, text } = await proposalRankingCsv(dataSource, currentUser(req), idParam(req.params.id, 'proposal'));
    res.attachment(fileName).type('text/csv; charset=utf-8').send(text);
  });
  router.get('/:id/netlist.cir', validateQuery(NETLIST_QUERY), async (req, res) => {
    const { fileName, text } = await proposalNetlist(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), res.locals.query);
    res.attachment(fileName).type('text/plain; charset=utf-8').send(text);
  });
  router.get('/:id/export.json', async (req, res) => {
    const { fileName, document } = await proposalExport(dataSource, currentUser(req), idParam(req.params.id, 'proposal'));
    res.attachment(fileName).json(document);
  });
  router.get('/:id/verification', async (req, res) => {
    res.json(await verificationStatus(dataSource, currentUser(req), idParam(req.params.id, 'proposal')));
  });
  router.post('/:id/verification', requirePermission('proposals:verify'), async (req, res) => {
    // 202 either way: a new job, or the equal one already waiting or simulating (never two at once).
    const { job } = await requestVerification(dataSource, currentUser(req), idParam(req.params.id, 'proposal'));
    verification.kick();
    res.status(202).json(job);
  });
  router.post('/:id/verification/monte-carlo', requirePermission('proposals:verify'), validateBody(MONTE_CARLO_BODY), async (req, res) => {
    const { job } = await requestMonteCarlo(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body);
    verification.kick();
    res.status(202).json(job);
  });
  router.delete('/:id/verification/:jobId', async (req, res) => {
    // The requester, a reviewer or an administrator (decided per job in the service, so no role guard here).
    const job = await withdrawJob(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), idParam(req.params.jobId, 'verification-job'));
    verification.withdrawn(job.id);
    res.json(job);
  });
  router.get('/:id/comments', async (req, res) => {
    res.json({ items: await listComments(dataSource, currentUser(req), idParam(req.params.id, 'proposal')) });
  });
  router.post('/:id/comments', requirePermission('proposals:comment'), validateBody(COMMENT_BODY), async (req, res) => {
    res.status(201).json(await postComment(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body));
  });
  router.post('/:id/comments/:commentId/replies', requirePermission('proposals:comment'), validateBody(REPLY_BODY), async (req, res) => {
    res.status(201).json(await replyToComment(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), idParam(req.params.commentId, 'comment'), req.body));
  });
  router.patch('/:id/comments/:commentId', requirePermission('proposals:comment'), validateBody(THREAD_STATE_BODY), async (req, res) => {
    res.json(await setThreadState(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), idParam(req.params.commentId, 'comment'), req.body));
  });
  router.get('/:id/audit', async (req, res) => {
    res.json({ items: await proposalAudit(dataSource, currentUser(req), idParam(req.params.id, 'proposal')) });
  });
  return router;
}
