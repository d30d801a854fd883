// A small progress line for a terminal (stderr): bar, bytes, records, jets, rate, ETA.

import { Presets, SingleBar } from 'cli-progress';
import type { PipelineProgress } from './pipeline/sink';

function mb(n: number): string {
  return (n / 1048576).toFixed(n < 10 * 1048576 ? 1 : 0);
}

/** 1234567 → "1,234,567" (toLocaleString would load ICU: ~15 ms of start-up). */
export function fmtInt(n: number): string {
  const s = String(Math.round(Math.abs(n)));
  let out = '';
  for (let i = 0; i < s.length; i++) {
    if (i > 0 && (s.length - i) % 3 === 0) out += ',';
    out += s[i];
  }
  return n < 0 ? '-' + out : out;
}

export function progressText(p: PipelineProgress, width = 24): string {
  const frac = p.bytesTotal ? Math.min(1, p.bytesRead / p.bytesTotal) : null;
  const secs = p.elapsedMs / 1000;
  const rate = secs > 0 ? p.jets / secs : 0;
  let s = '';
  if (frac !== null) {
    const full = Math.round(frac * width);
    s += `${(frac * 100).toFixed(0).padStart(3)}% [${'#'.repeat(full)}${'-'.repeat(width - full)}] ${mb(p.bytesRead)}/${mb(p.bytesTotal!)} MB`;
  } else {
    s += `${mb(p.bytesRead)} MB`;
  }
  s += `  records ${fmtInt(p.records)}  jets ${fmtInt(p.jets)}  ${fmtInt(rate)} jets/s`;
  if (frac !== null && frac > 0.01 && frac < 1) s += `  ETA ${Math.ceil((secs * (1 - frac)) / frac)} s`;
  if (p.skipped) s += `  skipped ${fmtInt(p.skipped)}`;
  return s;
}

/**
 * Progress on a stream: on a terminal a cli-progress bar (bytes read of the file, records, jets, rate, ETA), or
 * an updating text line when the size is unknown (stdin); on a pipe or file, a plain line every few seconds.
 */
export class ProgressLine {
  private last = 0;
  private shown = false;
  private bar: SingleBar | null = null;
  constructor(private readonly out: NodeJS.WriteStream) {}

  update(p: PipelineProgress): void {
    if (!this.out.isTTY) {
      if (p.elapsedMs - this.last >= 5000 || p.done) {
        this.last = p.elapsedMs;
        this.out.write(progressText(p) + '\n');
      }
      return;
    }
    const secs = p.elapsedMs / 1000;
    const payload = {
      read: mb(p.bytesRead),
      size: p.bytesTotal ? mb(p.bytesTotal) : '?',
      records: fmtInt(p.records),
      jets: fmtInt(p.jets),
      rate: fmtInt(secs > 0 ? p.jets / secs : 0),
      skipped: p.skipped ? `  skipped ${fmtInt(p.skipped)}` : '',
    };
    if (p.bytesTotal) {
      if (!this.bar) {
        this.bar = new SingleBar(
          {
            stream: this.out,
            format: '{percentage}% [{bar}] {read}/{size} MB  records {records}  jets {jets}  {rate} jets/s  ETA {eta_formatted}{skipped}',
            barsize: 24,
            barCompleteChar: '#',
            barIncompleteChar: '-',
            hideCursor: true,
            clearOnComplete: true,
            fps: 8,
          },
          Presets.legacy,
        );
        this.bar.start(p.bytesTotal, 0, payload);
        this.shown = true;
      }
      this.bar.update(Math.min(p.bytesRead, p.bytesTotal), payload);
      return;
    }
    const cols = this.out.columns || 100;
    let t = progressText(p);
    if (t.length > cols - 1) t = t.slice(0, cols - 1);
    this.out.write('\r' + t + '\x1b[K');
    this.shown = true;
  }

  /** Removes the bar (before the final report or an error message). */
  clear(): void {
    if (this.bar) {
      this.bar.stop();
      this.bar = null;
    } else if (this.shown && this.out.isTTY) this.out.write('\r\x1b[K');
    this.shown = false;
  }
}
