import type { Checkpoint } from '../../lib/model/checkpoint';
import type { ModelParams } from '../../lib/model/params';
import { sameParams } from '../plan/matchedTrial';

/** Wall time between two copies of the run the UI keeps for a worker that dies (ms). */
export const KEEP_EVERY_MS = 10_000;

/** What a kept copy stands for: the run (epoch, parameters) and when it was taken. */
export interface KeptMark {
  epoch: number;
  params: ModelParams;
  at: number;
}

/**
 * Whether the UI should take a fresh copy: none yet; the snapshots show another run or other
 * parameters than the copy (resuming it would bring back the wrong run); or the copy is
 * KEEP_EVERY_MS old. `snap` is the latest snapshot, or null when there is none.
 */
export function keepDue(
  mark: KeptMark | null,
  snap: { epoch: number; params: ModelParams } | null,
  now: number,
): boolean {
  if (!mark) return true;
  if (snap && (snap.epoch !== mark.epoch || !sameParams(snap.params, mark.params))) return true;
  return now - mark.at >= KEEP_EVERY_MS;
}

/**
 * The checkpoint the UI holds so that a dead worker's run can go on in a new one (simulation.svelte.ts).
 * One copy is asked for at a time; a copy asked for before the run was replaced (`forget`) is
 * dropped when it arrives, since it may be of the old run.
 */
export class KeptCheckpoint {
  private cp: Checkpoint | null = null;
  private mark: KeptMark | null = null;
  private asking = false;
  private generationCount = 0;

  /** The latest copy: hand a copy of it on (`copyCheckpoint`), it may be needed again. */
  get checkpoint(): Checkpoint | null {
    return this.cp;
  }

  due(snap: { epoch: number; params: ModelParams } | null, now: number): boolean {
    return !this.asking && keepDue(this.mark, snap, now);
  }

  /** A new run is being started: the next copy is due at once, one in flight no longer counts. */
  forget(): void {
    this.generationCount++;
    this.mark = null;
    this.asking = false;
  }

  /** Counts `forget` calls: a checkpoint asked for under an older count may be of a run since replaced. */
  get generation(): number {
    return this.generationCount;
  }

  /**
   * A checkpoint someone else asked for (a save), asked when `generation` was `asked`: kept as a copy
   * (its owner may hand it on). The worker answers in order, so whatever arrives last is the newest.
   */
  offer(cp: Checkpoint, asked: number, epoch: number, now: number): void {
    if (asked === this.generationCount) this.keep(copyCheckpoint(cp), epoch, now);
  }

  /** Ask for a copy with `take`; `epoch` says, when it arrives, which run the UI shows. */
  async refresh(take: () => Promise<Checkpoint>, epoch: () => number, now: () => number): Promise<void> {
    if (this.asking) return;
    const generation = this.generationCount;
    this.asking = true;
    try {
      const cp = await take();
      if (generation === this.generationCount) this.keep(cp, epoch(), now());
    } finally {
      if (generation === this.generationCount) this.asking = false;
    }
  }

  private keep(cp: Checkpoint, epoch: number, at: number): void {
    this.cp = cp;
    this.mark = { epoch, params: cp.params, at };
  }
}

/** A copy with its own spectrum, to transfer while the original stays. */
export function copyCheckpoint(cp: Checkpoint): Checkpoint {
  return { ...cp, params: { ...cp.params }, rng: [cp.rng[0], cp.rng[1], cp.rng[2], cp.rng[3]], qHat: cp.qHat.slice() };
}
