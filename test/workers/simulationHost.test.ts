import { afterEach, describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { retryCheckpoint } from '../../lib/run/blowUpRetry';
import { BUDGET_ROW_WIDTH } from '../../workers/budgetRows';
import { RESCUE_EVERY } from '../../workers/rescuePoint';
import type { Snapshot } from '../../workers/simulationApi';
import { SimulationHost } from '../../workers/simulationHost';
import { stateChecksum } from '../../lib/io/digest';

// A small grid with the forcing annulus inside its dealiased range, so each step takes well under 1 ms.
const SMALL = { nx: 32, ny: 32, kf: 6, dkf: 1 };

const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

describe('SimulationHost', () => {
  let host: SimulationHost;
  afterEach(async () => {
    await host.dispose();
  });

  it('answers at once when the state is newer, and the first snapshot is the model at rest', async () => {
    host = new SimulationHost();
    const info = await host.init(SMALL);
    expect(info.params.nx).toBe(32);
    expect(info.forcedModes).toBeGreaterThan(0);
    const s = await host.nextSnapshot({ after: 0 });
    expect(s.version).toBe(1);
    expect([s.nx, s.ny, s.steps, s.time]).toEqual([32, 32, 0, 0]);
    expect(s.values).toBeInstanceOf(Float64Array);
    expect(s.values.length).toBe(32 * 32);
    expect(s.playing).toBe(false);
    expect(s.stopped).toBeNull();
  });

  it('waits for a change, then sends the same bits as a model stepped directly', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const first = await host.nextSnapshot({ after: 0 });
    let answered = false;
    const next = host.nextSnapshot({ after: first.version }).then((s) => ((answered = true), s));
    await sleep(20);
    expect(answered).toBe(false);
    const report = await host.stepOnce();
    const s = await next;
    expect(s.steps).toBe(1);
    expect(report.steps).toBe(s.report.steps);
    const direct = new Model(SMALL);
    direct.step(1);
    expect(Array.from(s.values)).toEqual(Array.from(direct.field('u')));
    expect(s.report.time).toBe(direct.report.time);
  });

  it('coalesces many steps of play into one snapshot per request, and pause holds the state', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s0 = await host.nextSnapshot({ after: 0 });
    await host.play();
    // Ask at a frame-like pace until the run is well under way; replies cover many steps each
    // (no wall-clock bound, so a busy machine only makes this slower, never wrong).
    let s1 = s0;
    let widest = 0;
    for (let i = 0; i < 400 && s1.steps <= 20; i++) {
      await sleep(25);
      const next = await host.nextSnapshot({ after: s1.version });
      widest = Math.max(widest, next.steps - s1.steps);
      s1 = next;
    }
    expect(s1.playing).toBe(true);
    expect(s1.steps).toBeGreaterThan(20);
    expect(widest).toBeGreaterThan(1);
    expect(s1.time).toBeGreaterThan(0);
    await host.pause();
    const paused = await host.nextSnapshot({ after: s1.version });
    expect(paused.playing).toBe(false);
    await sleep(50);
    const later = host.nextSnapshot({ after: paused.version });
    let answered = false;
    void later.then(() => (answered = true));
    await sleep(50);
    expect(answered).toBe(false);
    await host.stepOnce();
    expect((await later).steps).toBe(paused.steps + 1);
  });

  it('refuses a second request while one is waiting', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s = await host.nextSnapshot({ after: 0 });
    const waiting = host.nextSnapshot({ after: s.version });
    await expect(host.nextSnapshot({ after: s.version })).rejects.toThrow(/already waiting/);
    await host.stepOnce();
    expect((await waiting).steps).toBe(1);
  });

  it('fills a recycled buffer instead of allocating one', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s0 = await host.nextSnapshot({ after: 0 });
    await host.stepOnce();
    const s1 = await host.nextSnapshot({ after: s0.version, recycleField: s0.values });
    expect(s1.values).toBe(s0.values);
    // A buffer of the wrong size is not used.
    await host.stepOnce();
    const s2 = await host.nextSnapshot({ after: s1.version, recycleField: new Float64Array(7) });
    expect(s2.values.length).toBe(32 * 32);
  });

  it('stops on a blow-up, keeps the last good state and will not play on', async () => {
    host = new SimulationHost();
    // A fixed step far above the CFL limit for an energetic start: the first step is refused.
    await host.init({ ...SMALL, init_energy: 100, cfl: 0, dt: 1 });
    const s0 = await host.nextSnapshot({ after: 0 });
    await host.stepOnce();
    const s1 = await host.nextSnapshot({ after: s0.version });
    expect(s1.stopped).toMatch(/CFL/);
    expect(s1.steps).toBe(0);
    expect(Array.from(s1.values)).toEqual(Array.from(s0.values));
    await host.play();
    const s2 = await host.nextSnapshot({ after: 0 });
    expect(s2.playing).toBe(false);
  });

  it('offers a restart from the last kept checkpoint with dt halved, and restarts there with the same bits as the command line rule', async () => {
    host = new SimulationHost();
    // A fixed step that holds while the flow is weak and fails once it has spun up (probed: step 2664).
    const params = { ...SMALL, cfl: 0, dt: 0.05 };
    await host.init(params);
    await host.play();
    let s = await host.nextSnapshot({ after: 0 });
    while (s.stopped === null) s = await host.nextSnapshot({ after: s.version });
    // The same run stepped directly blows up at the same step; the kept state is the last multiple of RESCUE_EVERY before it.
    const direct = new Model(params);
    let kept = direct.checkpoint();
    let blewAt: number;
    try {
      for (;;) {
        direct.step(1);
        if (direct.steps % RESCUE_EVERY === 0) kept = direct.checkpoint();
      }
    } catch {
      blewAt = direct.steps;
    }
    expect(blewAt).toBeGreaterThan(RESCUE_EVERY);
    expect(s.blowUp?.report).toMatchObject({ steps: blewAt, reason: expect.stringMatching(/CFL/) });
    expect(s.blowUp?.restart).toEqual({
      time: kept.time,
      steps: kept.steps,
      dt: { from: 0.05, to: 0.025 },
      cfl: { from: 0, to: 0 },
    });
    expect(s.blowUp?.refused).toBeNull();
    expect(s.steps).toBe(blewAt);

    await host.restartHalved();
    let r = await host.nextSnapshot({ after: s.version });
    expect([r.stopped, r.blowUp, r.params.dt, r.playing, r.epoch]).toEqual([null, null, 0.025, true, s.epoch + 1]);
    while (r.steps < kept.steps + 10) r = await host.nextSnapshot({ after: r.version });
    await host.pause();
    r = await host.nextSnapshot({ after: 0 });
    const resumed = Model.restore(retryCheckpoint(kept));
    resumed.step(r.steps - kept.steps);
    expect(r.steps).toBeGreaterThan(kept.steps);
    expect(r.checksum).toBe(stateChecksum(resumed.qHat));
  });

  it('halves an adaptive CFL target too, and refuses a restart whose halved target is out of range', async () => {
    host = new SimulationHost();
    const info = await host.init({ ...SMALL, cfl: 0.015 });
    // A clock so far on that one step no longer moves it: a blow-up on the first step.
    const cp = await host.checkpoint();
    await host.restore({ ...cp, time: 1e300 });
    await host.stepOnce();
    const s = await host.nextSnapshot({ after: 0 });
    expect(s.blowUp?.report.reason).toMatch(/collapsed/);
    expect(s.blowUp?.restart).toMatchObject({
      steps: 0,
      dt: { from: info.params.dt, to: info.params.dt / 2 },
      cfl: { from: 0.015, to: 0.0075 },
    });
    expect(s.blowUp?.refused).toMatch(/cfl/);
    await expect(host.restartHalved()).rejects.toThrow(/cfl/);
  });

  it('refuses a restart when the run has not blown up', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    await host.stepOnce();
    await expect(host.restartHalved()).rejects.toThrow(/not blown up/);
  });

  it('refuses bad parameters with the field named, and verbs before init', async () => {
    host = new SimulationHost();
    await expect(host.init({ nx: 100 })).rejects.toThrow(/nx/);
    await expect(host.play()).rejects.toThrow(/init/);
    await expect(host.stepOnce()).rejects.toThrow(/init/);
  });

  it('answers a request made before init once the model exists, and rejects it on dispose otherwise', async () => {
    host = new SimulationHost();
    const early = host.nextSnapshot({ after: 0 });
    await host.init(SMALL);
    expect((await early).version).toBe(1);
    const s = await host.nextSnapshot({ after: 0 });
    const orphan = host.nextSnapshot({ after: s.version });
    await host.dispose();
    await expect(orphan).rejects.toThrow(/disposed/);
  });

  it('sends one budget row per step since the last snapshot, and the checksum of the state', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s0 = await host.nextSnapshot({ after: 0 });
    expect(s0.budget.rows).toBe(0);
    for (let i = 0; i < 3; i++) await host.stepOnce();
    const s1 = await host.nextSnapshot({ after: s0.version });
    expect(s1.budget.rows).toBe(3);
    const direct = new Model(SMALL);
    const times: number[] = [];
    for (let i = 0; i < 3; i++) times.push(direct.step(1).time);
    expect(Array.from({ length: 3 }, (_, i) => s1.budget.data[i * BUDGET_ROW_WIDTH])).toEqual(times);
    expect(s1.checksum).toBe(stateChecksum(direct.qHat));
    expect(s1.checksum).not.toBe(s0.checksum);
    // Rows already sent are not sent again.
    await host.stepOnce();
    expect((await host.nextSnapshot({ after: s1.version, recycleBudget: s1.budget.data })).budget.rows).toBe(1);
  });

  it('carries the selected field, switching at once even while paused', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    await host.stepOnce();
    const s0 = await host.nextSnapshot({ after: 0 });
    expect(s0.field).toBe('u');
    await host.setField('zeta');
    const s1 = await host.nextSnapshot({ after: s0.version });
    expect(s1.field).toBe('zeta');
    const direct = new Model(SMALL);
    direct.step(1);
    expect(Array.from(s1.values)).toEqual(Array.from(direct.field('zeta')));
  });

  it('runs until a model time, then pauses there', async () => {
    host = new SimulationHost();
    const info = await host.init(SMALL);
    const target = 40 * info.params.dt;
    await host.runUntil(target);
    let s = await host.nextSnapshot({ after: 0 });
    while (s.playing) s = await host.nextSnapshot({ after: s.version });
    expect(s.until).toBeNull();
    expect(s.time).toBeGreaterThanOrEqual(target);
    // It stopped on the first step that reached the target.
    expect(s.time - s.report.dt).toBeLessThan(target);
  });

  it('changes physical parameters in place, keeping time, state and random stream', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    for (let i = 0; i < 3; i++) await host.stepOnce();
    const r = await host.reconfigure({ mu: 0.05, beta: 3 });
    expect(r).toMatchObject({ applied: true, how: 'inPlace' });
    await host.stepOnce();
    const s = await host.nextSnapshot({ after: 0 });
    expect([s.steps, s.params.mu, s.params.beta]).toEqual([4, 0.05, 3]);
    const direct = new Model(SMALL);
    direct.step(3);
    direct.reconfigure({ mu: 0.05, beta: 3 }).step(1);
    expect(s.checksum).toBe(stateChecksum(direct.qHat));
  });

  it('carries the state to a new grid, and starts afresh on a new domain (a new epoch)', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    for (let i = 0; i < 2; i++) await host.stepOnce();
    const s0 = await host.nextSnapshot({ after: 0 });
    expect(await host.reconfigure({ nx: 64, ny: 64 })).toMatchObject({ applied: true, how: 'regrid' });
    const s1 = await host.nextSnapshot({ after: s0.version });
    expect([s1.nx, s1.ny, s1.steps, s1.epoch]).toEqual([64, 64, 2, s0.epoch]);
    expect(s1.values.length).toBe(64 * 64);
    expect(await host.reconfigure({ Lx: 4 })).toMatchObject({ applied: true, how: 'fresh' });
    const s2 = await host.nextSnapshot({ after: s1.version });
    expect([s2.steps, s2.Lx, s2.epoch]).toEqual([0, 4, s0.epoch + 1]);
  });

  it('refuses a bad change with the field named and goes on playing unchanged', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    await host.play();
    const r = await host.reconfigure({ nu_order: 0 });
    expect(r.applied).toBe(false);
    if (!r.applied) expect(r.issues.map((i) => i.field)).toEqual(['nu_order']);
    const grid = await host.reconfigure({ nx: 32, kf: 12 });
    expect(grid.applied).toBe(false);
    if (!grid.applied) expect(grid.issues[0].message).toMatch(/dealiased range/);
    let s: Snapshot = await host.nextSnapshot({ after: 0 });
    while (s.steps < 3) s = await host.nextSnapshot({ after: s.version });
    expect(s.playing).toBe(true);
    expect(s.params.nu_order).toBe(DEFAULT_PARAMS.nu_order);
  });

  it('checkpoints and restores: the restored run steps on with the same bits', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    for (let i = 0; i < 3; i++) await host.stepOnce();
    const cp = await host.checkpoint();
    for (let i = 0; i < 2; i++) await host.stepOnce();
    const ahead = await host.nextSnapshot({ after: 0 });
    const info = await host.restore(cp);
    expect(info.params).toEqual(cp.params);
    const back = await host.nextSnapshot({ after: ahead.version });
    expect([back.steps, back.epoch, back.playing]).toEqual([3, ahead.epoch + 1, false]);
    for (let i = 0; i < 2; i++) await host.stepOnce();
    const again = await host.nextSnapshot({ after: back.version });
    expect(again.checksum).toBe(ahead.checksum);
  });
});
