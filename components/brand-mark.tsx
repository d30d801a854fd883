import Link from 'next/link';

/** Splitfield's mark: one stem that splits into a hard and a soft branch. */
function Mark() {
  return (
    <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden>
      <rect x="0.5" y="0.5" width="23" height="23" rx="6" className="fill-accent" />
      <path d="M12 20V12.5L6 5M12 12.5l6.5-4" className="stroke-white" strokeWidth="2" strokeLinecap="round" fill="none" />
      <circle cx="12" cy="12.5" r="1.8" className="fill-accent-soft" />
    </svg>
  );
}

export function BrandMark({ href = '/studies' }: { href?: string }) {
  return (
    <Link href={href} className="inline-flex items-center gap-2 font-semibold tracking-tight text-ink">
      <Mark />
      <span>Splitfield</span>
    </Link>
  );
}
