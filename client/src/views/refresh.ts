/**
 * When a view beside the editor renders again. Typing changes the spec and its diagnostics many
 * times a second; a view that rendered on each change would compete with the analysis the user is
 * waiting for. So a view renders once the changes pause (`delayMs` after the last one), never more
 * than one render at a time, and a change that arrives while a render runs leads to exactly one
 * more render after it (so the last state is always shown). No editor API here, so it is tested
 * in plain Node.
 */

/** Quiet time after the last change before a view beside the editor renders again. */
export const VIEW_REFRESH_DELAY_MS = 600;

export interface Timers {
  set(callback: () => void, ms: number): unknown;
  clear(handle: unknown): void;
}

const NODE_TIMERS: Timers = {
  set: (callback, ms) => setTimeout(callback, ms),
  clear: (handle) => clearTimeout(handle as ReturnType<typeof setTimeout>),
};

export class RefreshScheduler {
  private timer: unknown;
  private running = false;
  /** A change arrived while a render ran: render again once it ends (after the quiet time). */
  private pending = false;
  private disposed = false;

  constructor(
    private readonly render: () => Promise<void>,
    private readonly delayMs: number = VIEW_REFRESH_DELAY_MS,
    private readonly timers: Timers = NODE_TIMERS,
  ) {}

  /** Something the view shows changed: render after the next pause. */
  changed(): void {
    if (this.disposed) return;
    if (this.timer !== undefined) this.timers.clear(this.timer);
    this.timer = this.timers.set(() => this.fire(), this.delayMs);
  }

  /** Render as soon as no render is running (an explicit request, such as opening the view). */
  now(): void {
    if (this.disposed) return;
    if (this.timer !== undefined) this.timers.clear(this.timer);
    this.timer = undefined;
    this.fire();
  }

  /** True while a change waits for its pause or a render runs. */
  get busy(): boolean {
    return this.timer !== undefined || this.running || this.pending;
  }

  dispose(): void {
    this.disposed = true;
    if (this.timer !== undefined) this.timers.clear(this.timer);
    this.timer = undefined;
    this.pending = false;
  }

  private fire(): void {
    this.timer = undefined;
    if (this.running) {
      this.pending = true;
      return;
    }
    this.running = true;
    void this.render()
      .catch(() => undefined) // the render reports its own failures; the schedule goes on
      .finally(() => {
        this.running = false;
        if (this.pending && !this.disposed) {
          this.pending = false;
          this.changed();
        }
      });
  }
}
