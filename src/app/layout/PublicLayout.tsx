import type { ReactNode } from 'react';
import { Outlet } from 'react-router-dom';
import { useSetupStatus } from '../../features/auth/api/getSetupStatus';
import { Brand } from './Brand';
import { Footer, Main, SkipLink } from './Chrome';
import { ThemeToggle } from './ThemeToggle';

/** Frame for pages used while signed out: sign-in, setup, invitations, password reset. */
export function PublicLayout({ children }: { children?: ReactNode }) {
  const setup = useSetupStatus();
  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink />
      <header className="border-b-4 border-line bg-surface">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-3 px-4 py-2">
          <Brand teamName={setup.data?.teamName} />
          <ThemeToggle />
        </div>
      </header>
      <Main>{children ?? <Outlet />}</Main>
      <Footer />
    </div>
  );
}
