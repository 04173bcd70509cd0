import { useEffect, useRef, type ReactNode, type RefObject } from 'react';
import { useLocation } from 'react-router-dom';

/** First thing a keyboard reaches on every page. */
export function SkipLink() {
  return (
    <a
      href="#main"
      onClick={(event) => {
        event.preventDefault();
        document.getElementById('main')?.focus();
      }}
      className="sr-only z-50 rounded-md border-2 border-line bg-surface px-4 py-3 font-bold text-ink focus:not-sr-only focus:fixed focus:left-3 focus:top-3"
    >
      Skip to content
    </a>
  );
}

export function Footer() {
  return (
    <footer className="mt-10 border-t-2 border-line-soft">
      <p className="mx-auto max-w-6xl px-4 py-5 text-ink-muted">
        Holdfire is a planning and record aid, not a safety authority. Local codes, your site's rules and licensed practice govern.
      </p>
    </footer>
  );
}

/**
 * After a client-side route change, move focus to <main> so screen readers and keyboards start at the
 * new page instead of staying on the link that was pressed. Skipped on first load.
 */
function useFocusMainOnNavigate(ref: RefObject<HTMLElement | null>) {
  const { pathname } = useLocation();
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    ref.current?.focus({ preventScroll: false });
  }, [pathname, ref]);
}

export function Main({ children }: { children: ReactNode }) {
  const ref = useRef<HTMLElement>(null);
  useFocusMainOnNavigate(ref);
  return (
    <main id="main" ref={ref} tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 sm:py-8">
      {children}
    </main>
  );
}
