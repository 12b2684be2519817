import { Grid } from './grid';
import type { ModelParams } from './params';
import { RandomStream } from './randomStream';
import { replayArena } from './sharedArena';
import { buildStepParts } from './stepParts';
import { LEAVE_PHASE, MAX_THREADS, type PhasedStep, type StepTeam } from './stepTeam';

/**
 * A step shared by threads: the calling thread and helper threads run each phase of the step
 * (stepTeam.ts) on their shares, synchronised through a small control block of shared memory with
 * Atomics. Pure ECMAScript (SharedArrayBuffer and Atomics, ES2017): the host spawns the helper
 * threads (Node worker_threads in cli/, web workers in workers/) and only hands each one its
 * messages; everything else happens here. docs/threads.md has the protocol and why the bits do not
 * depend on the number of threads.
 *
 * The calling thread must be allowed to block (Atomics.wait): Node's main thread and any worker are;
 * a browser page's main thread is not, which is why the app steps in its simulation worker.
 */

/** The message that makes a helper thread join a step's team (structured-cloneable). */
export interface TeamInvitation {
  kind: 'stria-step-team';
  /** The validated parameters the step was built from. */
  params: ModelParams;
  /** The step's shared arrays, in the order buildStepParts made them. */
  buffers: SharedArrayBuffer[];
  /** The team's control block (CONTROL_SLOTS 32-bit integers). */
  control: SharedArrayBuffer;
  member: number;
  members: number;
}

/** Slots of the control block. */
const GEN = 0; // bumped by the calling thread for each phase
const PHASE = 1; // the phase of the current generation
const DONE = 2; // helpers that finished the current generation
const READY = 3; // helpers that joined
const FAILED = 4; // 1 once a helper has failed
const HELPERS_ASLEEP = 5; // helpers in Atomics.wait for the next generation
const CALLER_ASLEEP = 6; // 1 while the calling thread waits in Atomics.wait
const CONTROL_SLOTS = 8;

/**
 * Loads of a flag before a thread goes to sleep on it (a fraction of a millisecond): long enough to
 * stay awake through the calling thread's own work between phases (budgets, energy, the random
 * kick), as waking a sleeping thread took tens of microseconds a phase.
 */
const SPINS = 200000;
/** How long the calling thread waits for helpers that make no progress before it gives up (ms). */
const STALL_MS = 120_000;

/** A failure of the helper threads: the step that met it left the state as it was. */
export class ThreadTeamError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ThreadTeamError';
  }
}

/**
 * The helper threads a host offers, seen from the calling thread: how many, and how to post a
 * message to each. One team uses them at a time; a new team makes the last one leave first.
 */
export class StepThreads {
  /** Threads a step on them uses: the helpers and the calling thread. */
  readonly count: number;
  private current: ThreadTeam | null = null;
  private broken = false;

  /**
   * `post(i, message)` sends a message to helper thread i (0-based); SharedArrayBuffers go shared.
   * `waitForJoin`: whether `join` waits until the helpers have built their side. A browser worker
   * delivers what it posts only once it returns to its event loop, so there the calling thread must
   * not block right after inviting: the helpers then join while it is between tasks, and the first
   * phase waits for them as any phase does (a helper that cannot build its side fails that phase).
   */
  constructor(
    readonly helpers: number,
    private readonly post: (helper: number, message: TeamInvitation) => void,
    private readonly waitForJoin = true,
  ) {
    if (!(Number.isInteger(helpers) && helpers >= 0 && helpers < MAX_THREADS))
      throw new RangeError(`StepThreads: ${helpers} helper threads (at most ${MAX_THREADS - 1})`);
    this.count = helpers + 1;
  }

  /**
   * The helpers join the team of `step`, built from `params` over the shared `buffers`; returns when
   * every helper has built its side (or throws ThreadTeamError when one could not). The team in
   * use before, if any, is left first: its step runs on the calling thread alone from then on.
   */
  join(step: PhasedStep, params: ModelParams, buffers: SharedArrayBuffer[]): StepTeam {
    if (this.broken) throw new ThreadTeamError('the step threads failed earlier: a step runs on one thread');
    this.release();
    const team = new ThreadTeam(step, this.helpers, () => (this.broken = true));
    this.current = team;
    for (let i = 0; i < this.helpers; i++) {
      this.post(i, {
        kind: 'stria-step-team',
        params,
        buffers,
        control: team.control,
        member: i + 1,
        members: this.helpers + 1,
      });
    }
    if (this.waitForJoin) team.awaitReady();
    return team;
  }

  /** Whether a helper has failed (the threads are then no use: steps run on the calling thread). */
  get failed(): boolean {
    return this.broken;
  }

  /** The helpers leave the team in use (whose step then runs on the calling thread alone). */
  release(): void {
    this.current?.leave();
    this.current = null;
  }
}

/** The calling thread's side of a team. */
class ThreadTeam implements StepTeam {
  readonly control = new SharedArrayBuffer(4 * CONTROL_SLOTS);
  private readonly ctl = new Int32Array(this.control);
  private active = true;

  constructor(
    private readonly step: PhasedStep,
    private readonly helpers: number,
    private readonly onFailure: () => void,
  ) {}

  get members(): number {
    return this.active ? this.helpers + 1 : 1;
  }

  run(phase: number): void {
    if (!this.active) {
      this.step.runPhase(phase, 0, 1);
      return;
    }
    this.dispatch(phase);
    try {
      this.step.runPhase(phase, 0, this.helpers + 1);
    } finally {
      // Even when the calling thread's share threw: the helpers must be done before anything else.
      this.awaitDone();
    }
  }

  /** Wait until every helper has joined. */
  awaitReady(): void {
    this.waitUntil(READY, this.helpers, 'joining the step');
  }

  /** Send the helpers away (back to their message loops); the step runs here alone from now on. */
  leave(): void {
    if (!this.active) return;
    this.dispatch(LEAVE_PHASE);
    try {
      this.awaitDone();
    } finally {
      this.active = false;
    }
  }

  private dispatch(phase: number): void {
    const ctl = this.ctl;
    Atomics.store(ctl, PHASE, phase);
    Atomics.store(ctl, DONE, 0);
    Atomics.add(ctl, GEN, 1);
    if (Atomics.load(ctl, HELPERS_ASLEEP) > 0) Atomics.notify(ctl, GEN);
  }

  private awaitDone(): void {
    this.waitUntil(DONE, this.helpers, 'a phase of the step');
  }

  /** Spin, then sleep, until ctl[slot] reaches `target`; a failed or stalled helper ends the team. */
  private waitUntil(slot: number, target: number, what: string): void {
    const ctl = this.ctl;
    for (let i = 0; i < SPINS; i++) if (Atomics.load(ctl, slot) === target) return this.checkFailed(what);
    let last = Atomics.load(ctl, slot);
    let waited = 0;
    while (last !== target) {
      Atomics.store(ctl, CALLER_ASLEEP, 1);
      const r = Atomics.wait(ctl, slot, last, 50);
      Atomics.store(ctl, CALLER_ASLEEP, 0);
      const now = Atomics.load(ctl, slot);
      waited = now === last && r === 'timed-out' ? waited + 50 : 0;
      if (Atomics.load(ctl, FAILED) !== 0) break;
      if (waited >= STALL_MS) {
        this.active = false;
        this.onFailure();
        throw new ThreadTeamError(`a step thread stopped answering during ${what}`);
      }
      last = now;
    }
    this.checkFailed(what);
  }

  private checkFailed(what: string): void {
    if (Atomics.load(this.ctl, FAILED) === 0) return;
    this.active = false;
    this.onFailure();
    throw new ThreadTeamError(`a step thread failed during ${what}`);
  }
}

/**
 * The helper thread's side: build the step of the invitation over its shared arrays, report ready,
 * then run every phase the calling thread dispatches, on this member's share, until told to leave;
 * returns then (to the thread's message loop, for the next invitation). Blocks the thread meanwhile.
 */
export function joinStepTeam(invitation: TeamInvitation): void {
  const { params, buffers, control, member, members } = invitation;
  const ctl = new Int32Array(control);
  let step: PhasedStep;
  try {
    const grid = new Grid(params);
    step = buildStepParts(grid, params, new RandomStream(params.seed), replayArena(buffers), members).stepper;
  } catch (e) {
    fail(ctl, READY);
    throw e;
  }
  // Every generation from the team's first: phases may have been dispatched before this helper joined.
  let gen = 0;
  arrive(ctl, READY, members - 1);
  for (;;) {
    gen = awaitGeneration(ctl, gen);
    const phase = Atomics.load(ctl, PHASE);
    if (phase === LEAVE_PHASE) {
      arrive(ctl, DONE, members - 1);
      return;
    }
    try {
      step.runPhase(phase, member, members);
    } catch (e) {
      fail(ctl, DONE);
      throw e;
    }
    arrive(ctl, DONE, members - 1);
  }
}

/** Wait for a generation after `gen`: spin, then sleep. */
function awaitGeneration(ctl: Int32Array, gen: number): number {
  for (let i = 0; i < SPINS; i++) {
    const g = Atomics.load(ctl, GEN);
    if (g !== gen) return g;
  }
  for (;;) {
    Atomics.add(ctl, HELPERS_ASLEEP, 1);
    Atomics.wait(ctl, GEN, gen);
    Atomics.sub(ctl, HELPERS_ASLEEP, 1);
    const g = Atomics.load(ctl, GEN);
    if (g !== gen) return g;
  }
}

/** Count this helper into ctl[slot] and wake the calling thread when it was the last one. */
function arrive(ctl: Int32Array, slot: number, helpers: number): void {
  if (Atomics.add(ctl, slot, 1) + 1 === helpers && Atomics.load(ctl, CALLER_ASLEEP) !== 0) Atomics.notify(ctl, slot);
}

function fail(ctl: Int32Array, slot: number): void {
  Atomics.store(ctl, FAILED, 1);
  Atomics.add(ctl, slot, 1);
  Atomics.notify(ctl, slot);
}
