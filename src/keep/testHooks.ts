/**
 * A door for the browser tests, shut unless the address has `?test-hooks`: then `window.striaTest`
 * holds `killWorker()`, which ends the simulation worker as a crash would (e2e/resilience.e2e.test.ts),
 * and `fieldDrawTimes()`, the Field figure's recent draw times in ms (bench/drawBench.ts).
 * Nothing else is exposed; without the flag nothing at all.
 */
export interface TestHooks {
  killWorker(): void;
  fieldDrawTimes(): number[];
}

declare global {
  interface Window {
    striaTest?: TestHooks;
  }
}

export function installTestHooks(search: string, hooks: TestHooks): void {
  if (new URLSearchParams(search).has('test-hooks')) window.striaTest = hooks;
}
