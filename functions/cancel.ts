/**
 * Cancellation of a running sheet function: Excel calls `invocation.onCanceled` when the
 * cell is edited, deleted or recalculated before the answer arrives; the token tells the
 * worker pool to stop (terminate the worker) and inline work to stop at its next
 * progress check.
 */
export class CancelToken {
  private done = false;
  private readonly listeners: (() => void)[] = [];

  get canceled(): boolean {
    return this.done;
  }

  cancel(): void {
    if (this.done) return;
    this.done = true;
    for (const f of this.listeners.splice(0)) {
      try {
        f();
      } catch {
        // a listener's failure must not stop the others
      }
    }
  }

  /** Calls `f` on cancel (at once if already canceled); returns a function that removes it. */
  onCancel(f: () => void): () => void {
    if (this.done) {
      f();
      return () => undefined;
    }
    this.listeners.push(f);
    return () => {
      const i = this.listeners.indexOf(f);
      if (i >= 0) this.listeners.splice(i, 1);
    };
  }
}
