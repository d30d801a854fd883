// Runs a task whenever woken, never twice at once: a wake-up while it runs runs it once more afterwards (so an
// upload that arrives mid-run is never missed). Both job runners take queued samples this way.
export class WakeLoop {
  private running: Promise<void> | null = null;
  private again = false;

  constructor(
    private readonly task: () => Promise<void>,
    private readonly onError: (error: unknown) => void,
  ) {}

  wake(): void {
    if (this.running) {
      this.again = true;
      return;
    }
    this.running = this.task()
      .catch(this.onError)
      .finally(() => {
        this.running = null;
        if (this.again) {
          this.again = false;
          this.wake();
        }
      });
  }
}
