// A simulated clock for the ignition-sequence machine: timers fire exactly when due, in order, however
// far time jumps (xstate's SimulatedClock fires a long jump's timers late: a timer set while firing
// starts from the new time). It implements the Clock that xstate's createActor takes.

interface Timer {
  id: number;
  due: number;
  fn: () => void;
}

export class BenchClock {
  private nowMs = 0;
  private nextId = 1;
  private timers: Timer[] = [];

  now(): number {
    return this.nowMs;
  }

  setTimeout(fn: (...args: unknown[]) => void, timeout: number): number {
    const id = this.nextId++;
    this.timers.push({ id, due: this.nowMs + Math.max(0, timeout), fn: fn as () => void });
    return id;
  }

  clearTimeout(id: unknown): void {
    this.timers = this.timers.filter((t) => t.id !== id);
  }

  clearAll(): void {
    this.timers = [];
  }

  /** Moves to `ms`, firing every timer due on the way at its own time (earliest first, ties by order set). */
  advanceTo(ms: number): void {
    for (;;) {
      let next: Timer | undefined;
      for (const t of this.timers) if (t.due <= ms && (!next || t.due < next.due || (t.due === next.due && t.id < next.id))) next = t;
      if (!next) break;
      this.timers = this.timers.filter((t) => t !== next);
      this.nowMs = Math.max(this.nowMs, next.due);
      next.fn();
    }
    this.nowMs = Math.max(this.nowMs, ms);
  }

  /** The time of the earliest pending timer, or null. */
  nextDue(): number | null {
    let due: number | null = null;
    for (const t of this.timers) if (due === null || t.due < due) due = t.due;
    return due;
  }
}
