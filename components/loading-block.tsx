/** A quiet placeholder while data loads. */
export function LoadingBlock({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 py-10 text-sm text-ink-soft">
      <span className="h-2 w-2 animate-pulse rounded-full bg-accent" aria-hidden />
      {label}
    </div>
  );
}
