import { stateChecksum } from '../../lib/io/digest';
import { encodeRunFile } from '../../lib/io/runFile';
import type { Checkpoint } from '../../lib/model/checkpoint';
import type { SavedRun } from './autosave';
import { saveDue, type SaveReason } from './saveDue';
import { WorkerStoppedError } from './workerLink';

/** Wall time between two saves of a playing run (ms). */
export const AUTOSAVE_EVERY_MS = 15_000;
const TICK_MS = 1000;

/** What the autosaver needs of the simulation: whether it plays, and a checkpoint on request. */
export interface Saveable {
  readonly snapshot: { playing: boolean } | null;
  checkpoint(): Promise<Checkpoint>;
}

/**
 * Saves the run of the page into this tab's slot of IndexedDB (autosave.ts): every AUTOSAVE_EVERY_MS
 * while playing, once when it stops playing (a pause, a blow-up, the end of a run to a time), and
 * when the page is hidden or left (visibilitychange, pagehide: the last chance before a tab is
 * closed; the write may not finish then, so the timer bounds what can be lost). A state already
 * saved is not written again. Encoding a run file is fast (lib/io/base64.ts), so even a 1024² state
 * is a short pause of the page.
 */
export class Autosaver {
  /** The last save, or null before the first. */
  last = $state.raw<{ time: number; steps: number; savedAt: number; reason: SaveReason } | null>(null);
  /** Why the last save failed (IndexedDB refused or unavailable), or null. */
  failed = $state<string | null>(null);

  private timer: ReturnType<typeof setInterval> | null = null;
  private lastAt = 0;
  private saving = false;
  private again: SaveReason | null = null;
  private savedKey = '';
  private wasPlaying = false;
  private readonly onHide = (): void => {
    if (document.visibilityState === 'hidden') void this.save('hidden');
  };
  private readonly onPageHide = (): void => void this.save('hidden');

  constructor(
    private readonly sim: Saveable,
    private readonly tab: string,
    private readonly put: (run: SavedRun) => Promise<void>,
  ) {}

  start(): void {
    if (this.timer) return;
    this.lastAt = performance.now();
    this.timer = setInterval(() => this.tick(), TICK_MS);
    document.addEventListener('visibilitychange', this.onHide);
    window.addEventListener('pagehide', this.onPageHide);
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    document.removeEventListener('visibilitychange', this.onHide);
    window.removeEventListener('pagehide', this.onPageHide);
  }

  private tick(): void {
    const playing = this.sim.snapshot?.playing ?? false;
    const reason = saveDue(this.wasPlaying, playing, performance.now() - this.lastAt, AUTOSAVE_EVERY_MS);
    this.wasPlaying = playing;
    if (reason) void this.save(reason);
  }

  /** Save now unless this very state is saved already; asked during a save, it saves again right after. */
  async save(reason: SaveReason): Promise<void> {
    if (!this.sim.snapshot) return;
    if (this.saving) {
      this.again = reason;
      return;
    }
    this.saving = true;
    this.lastAt = performance.now();
    try {
      const playing = this.sim.snapshot.playing;
      const cp = await this.sim.checkpoint();
      const key = `${cp.steps}:${cp.time}:${stateChecksum(cp.qHat)}:${JSON.stringify(cp.params)}:${playing}`;
      if (key === this.savedKey) return;
      const savedAt = Date.now();
      await this.put({
        tab: this.tab,
        savedAt,
        time: cp.time,
        steps: cp.steps,
        playing,
        text: encodeRunFile(cp, new Date(savedAt)),
      });
      this.savedKey = key;
      this.last = { time: cp.time, steps: cp.steps, savedAt, reason };
      this.failed = null;
    } catch (e) {
      // A worker that died is replaced (simulation.svelte.ts); the next save goes to the new one.
      if (!(e instanceof WorkerStoppedError)) this.failed = e instanceof Error ? e.message : String(e);
    } finally {
      this.saving = false;
    }
    const again = this.again;
    this.again = null;
    if (again) await this.save(again);
  }
}
