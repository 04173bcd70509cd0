import { useEffect, useId, type ReactNode } from 'react';

/** Sets the tab title, so history, tabs and screen readers name the page. */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = `${title} · Holdfire`;
  }, [title]);
}

/** The one h1 of a page, with an optional kicker (the area) and a short lead paragraph. */
export function Page({
  title,
  kicker,
  lead,
  actions,
  children,
  narrow = false,
  documentTitle,
}: {
  title: string;
  /** Tab title when it should differ from the heading (e.g. "Home" rather than a greeting). */
  documentTitle?: string;
  kicker?: string;
  lead?: ReactNode;
  actions?: ReactNode;
  children?: ReactNode;
  narrow?: boolean;
}) {
  useDocumentTitle(documentTitle ?? title);
  return (
    <div className={narrow ? 'mx-auto w-full max-w-xl' : 'w-full'}>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-3 border-b-4 border-line pb-3">
        <div className="min-w-0">
          {kicker ? <p className="text-sm font-bold uppercase tracking-wider text-ink-muted">{kicker}</p> : null}
          <h1 className="text-3xl font-bold leading-tight text-ink sm:text-4xl">{title}</h1>
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      {lead ? <div className="mb-6 max-w-prose text-lg">{lead}</div> : null}
      {children}
    </div>
  );
}

/** A bordered section with its own h2. */
export function Section({ title, children, className = '' }: { title: string; children: ReactNode; className?: string }) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className={`min-w-0 rounded-md border-2 border-line bg-surface p-4 sm:p-5 ${className}`}>
      <h2 id={headingId} className="mb-3 text-2xl font-bold leading-tight">
        {title}
      </h2>
      {children}
    </section>
  );
}

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-4 text-ink-muted">
      <span aria-hidden="true" className="inline-block size-5 animate-spin rounded-full border-[3px] border-current border-t-transparent motion-reduce:animate-none" />
      {label}
    </p>
  );
}
