/**
 * The engine in worker threads (api/engine/engine-pool.ts): a ranking and an override evaluation
 * made by an app with an engine pool answer exactly what the engine answers when called on this
 * thread; an error the engine throws in a thread is thrown again with its class and message; the
 * process's pool is shared by the apps in it and its threads stop with the last one closed.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { evaluateDesign, recommend } from '#shared/engine/index';
import { ConvergenceError } from '#shared/engine/operating-point';
import { tradeoffSweep } from '#shared/engine/tradeoff-sweep';
import { InputError } from '#shared/engine/errors';
import type { Design, Spec } from '#shared/engine/types';
import { enginePoolState, rankSpec } from '../../api/engine/engine-pool';
import { describeError, errorFrom } from '../../api/engine/engine-tasks';
import { validateDesign } from '#shared/validate';
import { checkedSpecDocument } from '../../api/services/specs.service';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

const WORKERS = 2;
let api: TestApi;
let designer: ApiClient;
let specId: number;
let spec: Spec;

/** What JSON makes of a value (the API's answers are JSON). */
const asJson = (value: unknown) => JSON.parse(JSON.stringify(value)) as unknown;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'], engineWorkers: WORKERS });
  const project = await api.createProject(['requirements', 'designer']);
  specId = (await api.createSpec(project.id)).id;
  spec = checkedSpecDocument(specPayload());
  designer = await api.agentFor('designer');
});

afterAll(() => api.close());

describe('the engine pool', () => {
  test('when a proposal is asked for, then the engine runs in a thread and the ranking is the one the engine gives on this thread', async () => {
    expect(enginePoolState()?.threads).toBe(WORKERS);
    const before = enginePoolState()!.completedTasks;
    const response = await designer.post(`/api/specs/${specId}/proposals`).expect(201);
    expect(enginePoolState()!.completedTasks).toBe(before + 1);
    expect(response.body.result).toEqual(asJson(await recommend(spec, api.ruleSet)));
  });

  test('when several proposals are asked for at once, then every one is stored (their transactions never overlap on one SQLite connection)', async () => {
    const project = await api.createProject(['requirements', 'designer'], 'Concurrent rankings');
    const specs = [];
    for (let i = 0; i < 8; i += 1) specs.push(await api.createSpec(project.id, { payload: { ...specPayload(), title: `Concurrent ${i}` } }));
    const responses = await Promise.all(specs.map((s) => designer.post(`/api/specs/${s.id}/proposals`)));
    expect(responses.map((r) => r.status)).toEqual(specs.map(() => 201));
  });

  test('when a trade-off sweep is asked for, then a thread runs it and answers what the engine gives on this thread', async () => {
    const before = enginePoolState()!.completedTasks;
    const response = await designer.post('/api/tradeoff').send({ spec: specPayload(), topology: 'cascode', tailCurrentsA: [2e-4, 8e-4, -1] }).expect(200);
    expect(enginePoolState()!.completedTasks).toBe(before + 1);
    expect(response.body.points).toEqual(asJson(tradeoffSweep(spec, 'cascode', [2e-4, 8e-4, -1])));
  });

  test('when a designer has own values evaluated, then the thread answers what the engine gives on this thread', async () => {
    const proposal = await api.createProposal(specId);
    const design = proposal.result.options.find((o) => o.design)!.design!;
    const changed: Design = { ...design, collectorResistanceOhm: design.collectorResistanceOhm * 1.5 };
    const before = enginePoolState()!.completedTasks;
    const response = await designer.post(`/api/proposals/${proposal.id}/evaluation`).send({ design: changed }).expect(200);
    expect(enginePoolState()!.completedTasks).toBe(before + 1);
    // The route evaluates the design as the design schema completes it (defaults applied)
    const checked = validateDesign(changed);
    if (!checked.ok) throw new Error('the changed design should be valid');
    expect(response.body).toEqual(asJson(await evaluateDesign(spec, checked.value, api.ruleSet)));
  });

  test('when the engine throws in a thread, then the same class of error with the same message is thrown here', async () => {
    // A negative sample count is refused by the spec schema; given straight to the engine it throws
    const broken: Spec = { ...spec, monteCarlo: { ...spec.monteCarlo, samples: -1 } };
    const onThisThread = await recommend(broken, api.ruleSet).then(
      () => null,
      (error: unknown) => error as Error,
    );
    expect(onThisThread).toBeInstanceOf(RangeError);
    const fromThread = await rankSpec(broken, api.ruleSet).then(
      () => null,
      (error: unknown) => error as Error,
    );
    expect(fromThread).toBeInstanceOf(Error);
    expect({ name: fromThread!.name, message: fromThread!.message }).toEqual({ name: onThisThread!.name, message: onThisThread!.message });
  });

  test("when the engine's own errors cross, then they keep their class, message and path", () => {
    const input = errorFrom(describeError(new InputError('/supply/negativeV', 'must be below the positive rail')));
    expect(input).toBeInstanceOf(InputError);
    expect(input.message).toBe('/supply/negativeV: must be below the positive rail');
    expect((input as InputError).path).toBe('/supply/negativeV');
    const convergence = errorFrom(describeError(new ConvergenceError('the operating point did not converge', ['/tail/resistanceOhm'])));
    expect(convergence).toBeInstanceOf(ConvergenceError);
    expect(convergence.message).toBe('the operating point did not converge');
    expect((convergence as ConvergenceError).fields).toEqual(['/tail/resistanceOhm']);
  });

  test('when a second app joins the pool, then both share its threads, which stop when the last one closes', async () => {
    const second = await buildApiApp({ accounts: [], engineWorkers: WORKERS + 1 });
    expect(second.app.enginePool.workers).toBe(WORKERS);
    expect(enginePoolState()?.threads).toBe(WORKERS);
    await api.close();
    expect(enginePoolState()?.threads).toBe(WORKERS);
    await second.close();
    expect(enginePoolState()).toBeNull();
  });
});
