// A file that is still being written (an upload as it arrives), read from its start as the line source reads a file
// (lines.ts, SequentialFile): each read gives the bytes that are there, or waits for more until it is told the
// file's final size, or that the writing failed. The server's processing job reads an upload this way while it is
// received (lib/jobs/runner.ts, "early" jobs).
import { type FileHandle, open } from 'node:fs/promises';
import type { SequentialFile } from './lines';

/** How often the file is looked at again while no new bytes have come (and the writing has not ended). */
const POLL_MS = 5;

export class GrowingFile {
  private finalSize: number | null = null;
  private failure: Error | null = null;
  /** Readers waiting for more bytes (or the end), woken when the writing ends or fails. */
  private readonly waiting = new Set<() => void>();

  constructor(readonly path: string) {}

  /** The writing ended: the file has `size` bytes. */
  complete(size: number): void {
    this.finalSize = size;
    for (const wake of [...this.waiting]) wake();
  }

  /** The writing failed (or the reading is no longer wanted): the reader stops with this error. */
  fail(error: Error): void {
    this.failure = error;
    for (const wake of [...this.waiting]) wake();
  }

  /** Waits for the writing to end. */
  async completed(): Promise<number> {
    for (;;) {
      if (this.failure) throw this.failure;
      if (this.finalSize !== null) return this.finalSize;
      await this.pause();
    }
  }

  /** The first `n` bytes once they have been written (fewer when the whole file is shorter). */
  async head(n: number): Promise<Uint8Array> {
    const file = await this.open();
    try {
      const b = Buffer.alloc(n);
      let got = 0;
      while (got < n) {
        const { bytesRead } = await file.read(b, got, n - got, null);
        if (bytesRead === 0) break; // the whole file is shorter
        got += bytesRead;
      }
      return b.subarray(0, got);
    } finally {
      await file.close();
    }
  }

  /** The file from its start, for the line source: each read waits for bytes until the final size is reached. */
  async open(): Promise<SequentialFile> {
    const handle = await this.openWhenThere();
    let at = 0;
    const read = async (buffer: Buffer, offset: number, length: number): Promise<{ bytesRead: number }> => {
      for (;;) {
        if (this.failure) throw this.failure;
        const end = this.finalSize;
        if (end !== null && at >= end) return { bytesRead: 0 };
        const { bytesRead } = await handle.read(buffer, offset, length, at);
        if (bytesRead > 0) {
          at += bytesRead;
          return { bytesRead };
        }
        if (end !== null) throw new Error(`${this.path} ended after ${at} bytes, but ${end} were written`);
        await this.pause();
      }
    };
    return { read, close: () => handle.close() };
  }

  /** Opens the file, waiting for it to be created. */
  private async openWhenThere(): Promise<FileHandle> {
    for (;;) {
      if (this.failure) throw this.failure;
      try {
        return await open(this.path, 'r');
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code !== 'ENOENT' || this.finalSize !== null) throw error;
      }
      await this.pause();
    }
  }

  /** Resolves after POLL_MS, or at once when the writing ends or fails. */
  private pause(): Promise<void> {
    return new Promise((resolve) => {
      const done = () => {
        clearTimeout(timer);
        this.waiting.delete(done);
        resolve();
      };
      const timer = setTimeout(done, POLL_MS);
      this.waiting.add(done);
    });
  }
}
