// Runs a task whenever woken, never twice at once: a wake-up while it runs runs it once more afterwards (so an
// upload that arrives mid-run is never missed). Both job runners take queued samples this way.
import type { Sample } from '@/models/sample';
import { claimNextQueued } from './sample-states';

/** Claims queued samples in fair order (sample-states.ts) while `hasRoom`, handing each to `launch`. */
export async function claimWhileRoom(hasRoom: () => boolean, launch: (sample: Sample) => Promise<void>): Promise<void> {
  while (hasRoom()) {
    const sample = await claimNextQueued();
    if (!sample) return;
    await launch(sample);
  }
}

export class WakeLoop {
  private running: Promise<void> | null = null;
  private again = false;

  constructor(
    private readonly task: () => Promise<void>,
    private readonly onError: (error: unknown) => void,
  ) {}

  /** Wakes now and then every `pollMs` too, in case a wake-up was missed. */
  start(pollMs: number): void {
    setInterval(() => this.wake(), pollMs).unref();
    this.wake();
  }

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
