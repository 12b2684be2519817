import { describe, expect, it } from 'vitest';
import { SimulationHost } from '../../workers/simulationHost';

// Without cross-origin isolation there is no shared memory between workers (HTML Standard,
// "cross-origin isolation" [practice]): the run steps on one thread, says why, and goes on as before.
describe('the simulation worker’s threads', () => {
  it('runs on one thread and says why when memory cannot be shared, with the bits of one thread', async () => {
    expect(globalThis.crossOriginIsolated).not.toBe(true);
    const params = { nx: 32, ny: 32, kf: 8, dkf: 1.5, seed: 3 };
    const plain = new SimulationHost();
    await plain.init(params);
    await plain.stepOnce();
    const asked = new SimulationHost();
    await asked.init(params);
    const info = await asked.setThreads(2);
    expect(info.asked).toBe(2);
    expect(info.running).toBe(1);
    expect(info.note).toMatch(/not cross-origin isolated/);
    await asked.stepOnce();
    const [a, b] = [await plain.nextSnapshot({ after: 0 }), await asked.nextSnapshot({ after: 0 })];
    expect(b.threads).toEqual(info);
    expect(a.threads).toEqual({ asked: 1, running: 1, note: null });
    expect(b.checksum).toBe(a.checksum);
    await plain.dispose();
    await asked.dispose();
  });

  it('refuses a count that is not a whole number from 1 to 64', async () => {
    const host = new SimulationHost();
    for (const n of [0, 1.5, 65, Number.NaN]) await expect(host.setThreads(n)).rejects.toThrow(RangeError);
    await host.dispose();
  });
});
