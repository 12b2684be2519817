import { afterAll, describe, expect, it } from 'vitest';
import { BOUNDARY_RUNS, CASE_LIMIT_MS } from './boundaryRuns';
import { runBoundary, type BoundaryResult } from './support/runBoundary';

/**
 * Every input boundary fed random and malformed inputs (seeded fast-check, in a worker thread each,
 * with a per-case time limit): each must answer with its own error naming the field or the problem,
 * or accept a value that then works (a model that steps to a finite state or stops with a
 * BlowUpError). The properties are in ./boundaries/, the counts in ./boundaryRuns.ts.
 */
const results = new Map<string, BoundaryResult>();
// A hang is caught per case (CASE_LIMIT_MS); the whole property only needs room for its hundreds of
// cases on a loaded machine (a checkpoint case steps a model), so its limit is generous.
const PROPERTY_TIMEOUT_MS = 300_000;

// Concurrent: each property runs in a worker thread of its own, two at a time (runBoundary.ts).
describe.concurrent('input boundaries under random and malformed inputs', () => {
  for (const b of BOUNDARY_RUNS) {
    it(
      `${b.id}: ${b.boundary}`,
      async () => {
        const r = await runBoundary(new URL(`./boundaries/${b.id}.ts`, import.meta.url), b.runs, b.seed, CASE_LIMIT_MS);
        results.set(b.id, r);
        expect(r.hung, 'a case hung').toBeNull();
        expect(r.failed, `${r.error}\ncounterexample: ${r.counterexample}`).toBe(false);
        expect(r.numRuns).toBe(b.runs);
      },
      PROPERTY_TIMEOUT_MS,
    );
  }
});

afterAll(() => {
  const lines = BOUNDARY_RUNS.filter((b) => results.has(b.id)).map((b) => {
    const r = results.get(b.id)!;
    const tally = Object.entries(r.tally)
      .sort()
      .map(([k, n]) => `${k} ${n}`)
      .join(', ');
    return `${b.id.padEnd(15)} ${String(r.numRuns).padStart(5)} cases  ${r.seconds.toFixed(1).padStart(5)} s  ${tally}`;
  });
  if (lines.length) console.log(`boundary cases (seeded):\n${lines.join('\n')}`);
});
