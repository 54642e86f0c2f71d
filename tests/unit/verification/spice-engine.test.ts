/**
 * The server's SPICE engine (ngspice in a worker thread): runs are serialised and each caller gets
 * its own circuit's answer; a run past its time limit is stopped and the next one runs on a fresh
 * thread; ngspice's errors come back as messages; the thread is replaced after a number of runs
 * or once its WebAssembly heap passes a bound, and every run still answers. Expected values are Ohm's law and the voltage
 * divider, not the product's output.
 */
import { afterAll, describe, expect, test } from 'vitest';
import type { ResultType } from 'eecircuit-engine';
import { SpiceEngine, SpiceRunError } from '../../../api/verification/spice-engine';

const divider = (topOhm: number, bottomOhm: number) => `divider\nV1 in 0 10\nR1 in out ${topOhm}\nR2 out 0 ${bottomOhm}\n.op\n.end\n`;

function voltage(result: ResultType, node: string): number {
  if (result.dataType !== 'real') throw new Error('expected real data');
  const vector = result.data.find((d) => d.name.toLowerCase() === `v(${node})`);
  if (!vector) throw new Error(`no v(${node})`);
  return vector.values[0];
}

describe('SpiceEngine', () => {
  const engine = new SpiceEngine(10_000);
  afterAll(() => engine.stop());

  test('serialises concurrent runs and answers each with its own circuit', async () => {
    const ratios = [[1000, 1000], [3000, 1000], [1000, 4000], [9000, 1000]] as const;
    const results = await Promise.all(ratios.map(([top, bottom]) => engine.run(divider(top, bottom), 'Operating Point')));
    results.forEach((result, i) => {
      const [top, bottom] = ratios[i];
      expect(voltage(result, 'out')).toBeCloseTo((10 * bottom) / (top + bottom), 9);
    });
    expect(await engine.version()).toMatch(/^ngspice-\d+/);
  }, 60_000);

  test('turns an ngspice error into a message and keeps working', async () => {
    const broken = 'broken\nV1 in 0 1\nQ1 in in 0 NOSUCHMODEL\n.op\n.end\n';
    await expect(engine.run(broken, 'Operating Point')).rejects.toThrow(/nosuchmodel/i);
    expect(voltage(await engine.run(divider(2000, 2000), 'Operating Point'), 'out')).toBeCloseTo(5, 9);
  }, 60_000);

  test('stops a run past its time limit and starts a fresh simulator for the next', async () => {
    await engine.start();
    const startsBefore = engine.starts;
    // A transient of a second in 1 ns steps: a billion time points, far past a 300 ms limit.
    const endless = 'endless\nV1 in 0 PULSE(0 1 0 1n 1n 1u 2u)\nR1 in out 1k\nC1 out 0 1n\n.tran 1n 1\n.end\n';
    const stopped = engine.run(endless, undefined, 300);
    await expect(stopped).rejects.toBeInstanceOf(SpiceRunError);
    await expect(stopped).rejects.toThrow(/time limit/);
    expect(voltage(await engine.run(divider(1000, 3000), 'Operating Point'), 'out')).toBeCloseTo(7.5, 9);
    expect(engine.starts).toBe(startsBefore + 1);
  }, 60_000);

  test('refuses runs once shut down', async () => {
    const other = new SpiceEngine();
    await other.stop();
    await expect(other.run(divider(1, 1))).rejects.toThrow(/shut down/);
  });
});

describe('SpiceEngine recycling', () => {
  test('starts a fresh thread after the set number of runs, and runs queued across the change still answer their own circuit', async () => {
    const engine = new SpiceEngine(10_000, { recycleAfterRuns: 2 });
    try {
      const bottoms = [1000, 3000, 9000, 4000, 1000];
      const results = await Promise.all(bottoms.map((bottom) => engine.run(divider(1000, bottom), 'Operating Point')));
      results.forEach((result, i) => expect(voltage(result, 'out')).toBeCloseTo((10 * bottoms[i]) / (1000 + bottoms[i]), 9));
      // Runs 1–2 on the first thread, 3–4 on the second, 5 on the third.
      expect(engine.starts).toBe(3);
      expect(engine.recycles).toBe(2);
    } finally {
      await engine.stop();
    }
  }, 60_000);

  test('starts a fresh thread once the WebAssembly heap passes the bound', async () => {
    const engine = new SpiceEngine(10_000, { recycleAboveHeapBytes: 1024 });
    try {
      for (let i = 0; i < 2; i += 1) expect(voltage(await engine.run(divider(1000, 1000), 'Operating Point'), 'out')).toBeCloseTo(5, 9);
      // ngspice's heap is megabytes from its first run, so every run is past a 1 kB bound.
      expect(engine.heapBytes).toBeGreaterThan(2 ** 20);
      expect(engine.starts).toBe(2);
    } finally {
      await engine.stop();
    }
  }, 60_000);

  test('keeps one thread under the default bounds for a few hundred runs', async () => {
    const engine = new SpiceEngine(10_000);
    try {
      for (let i = 0; i < 200; i += 1) await engine.run(divider(1000, 1000 + i), 'Operating Point');
      expect(engine.starts).toBe(1);
      expect(engine.recycles).toBe(0);
    } finally {
      await engine.stop();
    }
  }, 120_000);
});
