// How sample pages write sizes, counts, durations and measured values.

const countFormat = new Intl.NumberFormat('en-GB');

/** 1234567 → "1,234,567". */
export function formatCount(n: number): string {
  return countFormat.format(n);
}

/** 1536 → "1.5 KB" (powers of 1024, one decimal below 10). */
export function formatBytes(bytes: number): string {
  const units = ['bytes', 'KB', 'MB', 'GB', 'TB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return `${unit === 0 || value >= 10 ? Math.round(value) : value.toFixed(1)} ${units[unit]}`;
}

/** 75 000 ms → "1 min 15 s"; below a minute in seconds. */
export function formatDuration(ms: number): string {
  const seconds = Math.max(0, Math.round(ms / 1000));
  if (seconds < 60) return `${seconds} s`;
  const minutes = Math.floor(seconds / 60);
  if (minutes < 60) return `${minutes} min ${seconds % 60} s`;
  return `${Math.floor(minutes / 60)} h ${minutes % 60} min`;
}

/** A measured value to four significant digits; a missing one (no SoftDrop splitting) as a dash. */
export function formatValue(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return Number(value.toPrecision(4)).toString();
}
