// How plane figures write numbers: three significant digits, and "–" for a value that is not defined.

export function formatValue(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e4 || magnitude < 1e-3) return value.toExponential(digits - 1);
  // Significant digits are kept (2.00, not 2): they say how precisely the value is given.
  return magnitude >= 10 ** digits ? Math.round(value).toString() : value.toPrecision(digits);
}

/** "1.23 ± 0.04". */
export function formatWithError(value: number | null | undefined, error: number | null | undefined): string {
  return `${formatValue(value)} ± ${formatValue(error, 2)}`;
}
