import { Link } from 'react-router-dom';

/** The Holdfire mark: a ring cut by a bar, i.e. "hold". Same drawing as public/favicon.svg. */
export function BrandMark({ className = 'size-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" className={className}>
      <circle cx="16" cy="16" r="12" fill="none" stroke="currentColor" strokeWidth="4" />
      <rect x="3" y="13" width="26" height="6" rx="1.5" fill="currentColor" />
    </svg>
  );
}

export function Brand({ teamName }: { teamName?: string | null }) {
  return (
    <Link to="/" className="inline-flex min-h-12 min-w-0 max-w-full items-center gap-2.5 text-ink no-underline">
      <BrandMark className="size-8 shrink-0" />
      <span className="flex min-w-0 flex-col leading-tight">
        <span className="text-xl font-bold tracking-wide">Holdfire</span>
        {teamName ? <span className="truncate text-sm text-ink-muted">{teamName}</span> : null}
      </span>
    </Link>
  );
}
