/** A labelled bar from 0 to 1; without a fraction it shows an indeterminate stripe. */
export function ProgressBar({ label, fraction }: { label: string; fraction: number | null }) {
  const percent = fraction === null ? null : Math.round(Math.min(1, Math.max(0, fraction)) * 100);
  return (
    <div
      role="progressbar"
      aria-label={label}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={percent ?? undefined}
      className="h-2.5 w-full overflow-hidden rounded-full bg-paper-sunk"
    >
      <div
        className={`h-full rounded-full bg-accent transition-[width] duration-300 ${percent === null ? 'w-1/3 animate-pulse' : ''}`}
        style={percent === null ? undefined : { width: `${percent}%` }}
      />
    </div>
  );
}
