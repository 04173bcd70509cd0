import { useEffect, useState, type ReactNode } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import type { Me } from '../../contract/people';
import { Button } from '../../components/ui/Button';
import { Notice } from '../../components/ui/Notice';
import { Loading } from '../../components/ui/Page';
import { useSetupStatus } from '../../features/auth/api/getSetupStatus';
import { useSignOut } from '../../features/auth/api/signOut';
import { errorMessage } from '../../lib/api';
import { roleList } from '../../lib/roles';
import { useMe } from '../../lib/session';
import { Brand } from './Brand';
import { Footer, Main, SkipLink } from './Chrome';
import { MainNav } from './MainNav';
import { PublicLayout } from './PublicLayout';
import { ThemeToggle } from './ThemeToggle';

/** Signed-in frame: only renders for a known person; otherwise sends them to sign in and back. */
export function AppShell() {
  const me = useMe();
  const location = useLocation();

  if (me.data) {
    return (
      <ShellLayout me={me.data}>
        <Outlet />
      </ShellLayout>
    );
  }
  if (me.data === null) {
    const here = location.pathname + location.search + location.hash;
    const to = here === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(here)}`;
    return <Navigate to={to} replace />;
  }
  if (me.isError) {
    return (
      <PublicLayout>
        <h1 className="mb-4 text-3xl font-bold">Holdfire is not answering</h1>
        <Notice tone="danger" title="Could not check who is signed in">
          <p>{errorMessage(me.error)}</p>
          <Button className="mt-3" onClick={() => void me.refetch()} pending={me.isFetching} pendingLabel="Trying…">
            Try again
          </Button>
        </Notice>
      </PublicLayout>
    );
  }
  return (
    <PublicLayout>
      <Loading />
    </PublicLayout>
  );
}

export function ShellLayout({ me, children }: { me: Me; children: ReactNode }) {
  const setup = useSetupStatus();
  const signOut = useSignOut();
  const [menuOpen, setMenuOpen] = useState(false);
  const { pathname } = useLocation();

  // A chosen link closes the phone menu.
  useEffect(() => setMenuOpen(false), [pathname]);

  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink />
      <header className="border-b-4 border-line bg-surface">
        {/*
          One set of elements for every width. Below lg the person, sign-out and links fold into the menu;
          from lg up #site-menu uses display:contents so its children join this grid: person and sign-out
          in the top row, the links in a row of their own. DOM order = reading order at both sizes.
        */}
        <div className="mx-auto grid max-w-6xl grid-cols-[minmax(0,1fr)_auto] items-center gap-x-3 px-4 lg:grid-cols-[minmax(0,1fr)_auto_auto]">
          <div className="col-start-1 row-start-1 min-w-0 py-2">
            <Brand teamName={setup.data?.teamName} />
          </div>
          <div className="col-start-2 row-start-1 flex items-center gap-2 py-2">
            <ThemeToggle collapse />
            <button
              type="button"
              className="inline-flex min-h-12 shrink-0 items-center gap-2 rounded-md border-2 border-line bg-surface px-3 font-bold text-ink hover:bg-selected lg:hidden"
              aria-expanded={menuOpen}
              aria-controls="site-menu"
              onClick={() => setMenuOpen((open) => !open)}
              onKeyDown={(event) => {
                if (event.key === 'Escape') setMenuOpen(false);
              }}
            >
              <svg viewBox="0 0 20 20" aria-hidden="true" className="size-5 shrink-0">
                {menuOpen ? (
                  <path d="M5 5l10 10M15 5L5 15" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
                ) : (
                  <path d="M3 5h14M3 10h14M3 15h14" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
                )}
              </svg>
              Menu
            </button>
          </div>
          <div
            id="site-menu"
            className={`${menuOpen ? 'flex' : 'hidden'} col-span-2 flex-col gap-3 border-t-2 border-line-soft py-3 lg:contents`}
            onKeyDown={(event) => {
              if (event.key === 'Escape') setMenuOpen(false);
            }}
          >
            <div className="flex flex-wrap items-center gap-3 lg:col-start-3 lg:row-start-1 lg:flex-nowrap lg:py-2">
              <p className="min-w-0 leading-tight">
                <span className="block font-bold">{me.name}</span>
                <span className="block text-sm text-ink-muted">{roleList(me.roles)}</span>
              </p>
              <Button className="shrink-0" onClick={() => signOut.mutate()} pending={signOut.isPending} pendingLabel="Signing out…">
                Sign out
              </Button>
            </div>
            {signOut.isError ? (
              <div className="lg:col-span-3 lg:row-start-3 lg:pb-3">
                <Notice tone="danger" title="Could not sign out">
                  <p>{errorMessage(signOut.error)}</p>
                </Notice>
              </div>
            ) : null}
            <div className="border-t-2 border-line-soft pt-3 lg:col-span-3 lg:row-start-2 lg:border-t-0 lg:pt-0">
              <MainNav roles={me.roles} />
            </div>
          </div>
        </div>
      </header>
      <Main>{children}</Main>
      <Footer />
    </div>
  );
}
