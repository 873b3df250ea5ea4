import { DestroyRef, inject } from '@angular/core';

/** Waits between polls, in ms: quick at first (a check usually ends within seconds), then every 15 s. */
export const POLL_DELAYS_MS: readonly number[] = [1000, 2000, 4000, 8000, 15000];

/**
 * A well-behaved poll for a result that arrives later: at most one timer pending, the wait grows with
 * each empty answer, it stops when the caller says the result is there, and with the component.
 * Create it in an injection context (a component's field or constructor).
 */
export class BackoffPoll {
  private timer: ReturnType<typeof setTimeout> | null = null;
  private attempt = 0;

  constructor(
    private readonly poll: () => void,
    private readonly delays: readonly number[] = POLL_DELAYS_MS,
    /** After this many polls without the result it gives up (about ten minutes with the default waits). */
    private readonly maxAttempts = 45,
  ) {
    inject(DestroyRef).onDestroy(() => this.stop());
  }

  /** True while a poll is waiting to run. */
  get pending(): boolean {
    return this.timer !== null;
  }

  /** Asks again after the next wait; a no-op while a poll is already waiting. */
  schedule(): void {
    if (this.timer !== null || this.attempt >= this.maxAttempts) {
      return;
    }
    const delay = this.delays[Math.min(this.attempt, this.delays.length - 1)];
    this.attempt++;
    this.timer = setTimeout(() => {
      this.timer = null;
      this.poll();
    }, delay);
  }

  /** The result is there (or nothing is awaited any more): cancel and start the waits afresh next time. */
  stop(): void {
    if (this.timer !== null) {
      clearTimeout(this.timer);
      this.timer = null;
    }
    this.attempt = 0;
  }
}
