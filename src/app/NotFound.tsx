import { Link, useLocation } from 'react-router-dom';
import { Page } from '../components/ui/Page';
import { Loading } from '../components/ui/Page';
import { useMe } from '../lib/session';
import { ShellLayout } from './layout/AppShell';
import { PublicLayout } from './layout/PublicLayout';

export function NotFound() {
  const { pathname } = useLocation();
  return (
    <Page title="Page not found" kicker="404">
      <div className="max-w-prose space-y-4">
        <p className="text-lg">
          There is no page at <code className="break-all rounded-sm bg-sunken px-1 font-mono">{pathname}</code>. The link may be mistyped or
          out of date.
        </p>
        <p>
          <Link to="/">Go to the home page</Link>
        </p>
      </div>
    </Page>
  );
}

/**
 * Unknown addresses get a 404 whether or not someone is signed in (no detour via sign-in for a typo);
 * signed-in people keep their navigation.
 */
export function NotFoundRoute() {
  const me = useMe();
  if (me.data) {
    return (
      <ShellLayout me={me.data}>
        <NotFound />
      </ShellLayout>
    );
  }
  return <PublicLayout>{me.isPending ? <Loading /> : <NotFound />}</PublicLayout>;
}
