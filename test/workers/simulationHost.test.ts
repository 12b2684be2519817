import { afterEach, describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { SimulationHost } from '../../workers/simulationHost';

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
    const s = await host.nextSnapshot(0);
    expect(s.version).toBe(1);
    expect([s.nx, s.ny, s.steps, s.time]).toEqual([32, 32, 0, 0]);
    expect(s.zeta).toBeInstanceOf(Float64Array);
    expect(s.zeta.length).toBe(32 * 32);
    expect(s.playing).toBe(false);
    expect(s.stopped).toBeNull();
  });

  it('waits for a change, then sends the same bits as a model stepped directly', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const first = await host.nextSnapshot(0);
    let answered = false;
    const next = host.nextSnapshot(first.version).then((s) => ((answered = true), s));
    await sleep(20);
    expect(answered).toBe(false);
    const report = await host.stepOnce();
    const s = await next;
    expect(s.steps).toBe(1);
    expect(report.steps).toBe(s.report.steps);
    const direct = new Model(SMALL);
    direct.step(1);
    expect(Array.from(s.zeta)).toEqual(Array.from(direct.field('zeta')));
    expect(s.report.time).toBe(direct.report.time);
  });

  it('coalesces many steps of play into one snapshot per request, and pause holds the state', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s0 = await host.nextSnapshot(0);
    await host.play();
    // Ask at a frame-like pace until the run is well under way; replies cover many steps each
    // (no wall-clock bound, so a busy machine only makes this slower, never wrong).
    let s1 = s0;
    let widest = 0;
    for (let i = 0; i < 400 && s1.steps <= 20; i++) {
      await sleep(25);
      const next = await host.nextSnapshot(s1.version);
      widest = Math.max(widest, next.steps - s1.steps);
      s1 = next;
    }
    expect(s1.playing).toBe(true);
    expect(s1.steps).toBeGreaterThan(20);
    expect(widest).toBeGreaterThan(1);
    expect(s1.time).toBeGreaterThan(0);
    await host.pause();
    const paused = await host.nextSnapshot(s1.version);
    expect(paused.playing).toBe(false);
    await sleep(50);
    const later = host.nextSnapshot(paused.version);
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
    const s = await host.nextSnapshot(0);
    const waiting = host.nextSnapshot(s.version);
    await expect(host.nextSnapshot(s.version)).rejects.toThrow(/already waiting/);
    await host.stepOnce();
    expect((await waiting).steps).toBe(1);
  });

  it('fills a recycled buffer instead of allocating one', async () => {
    host = new SimulationHost();
    await host.init(SMALL);
    const s0 = await host.nextSnapshot(0);
    await host.stepOnce();
    const s1 = await host.nextSnapshot(s0.version, s0.zeta);
    expect(s1.zeta).toBe(s0.zeta);
    // A buffer of the wrong size is not used.
    await host.stepOnce();
    const s2 = await host.nextSnapshot(s1.version, new Float64Array(7));
    expect(s2.zeta.length).toBe(32 * 32);
  });

  it('stops on a blow-up, keeps the last good state and will not play on', async () => {
    host = new SimulationHost();
    // A fixed step far above the CFL limit for an energetic start: the first step is refused.
    await host.init({ ...SMALL, init_energy: 100, cfl: 0, dt: 1 });
    const s0 = await host.nextSnapshot(0);
    await host.stepOnce();
    const s1 = await host.nextSnapshot(s0.version);
    expect(s1.stopped).toMatch(/CFL/);
    expect(s1.steps).toBe(0);
    expect(Array.from(s1.zeta)).toEqual(Array.from(s0.zeta));
    await host.play();
    const s2 = await host.nextSnapshot(0);
    expect(s2.playing).toBe(false);
  });

  it('refuses bad parameters with the field named, and verbs before init', async () => {
    host = new SimulationHost();
    await expect(host.init({ nx: 100 })).rejects.toThrow(/nx/);
    await expect(host.play()).rejects.toThrow(/init/);
    await expect(host.stepOnce()).rejects.toThrow(/init/);
  });

  it('answers a request made before init once the model exists, and rejects it on dispose otherwise', async () => {
    host = new SimulationHost();
    const early = host.nextSnapshot(0);
    await host.init(SMALL);
    expect((await early).version).toBe(1);
    const s = await host.nextSnapshot(0);
    const orphan = host.nextSnapshot(s.version);
    await host.dispose();
    await expect(orphan).rejects.toThrow(/disposed/);
  });
});
