import { Link, Outlet } from 'react-router-dom';
import { hasAnyRole, ROLE_LABELS, type Role } from '../domain/people/roles';
import { Notice } from '../components/ui/Notice';
import { Page } from '../components/ui/Page';
import { useSignedInMe } from '../lib/session';

/**
 * Guards a group of routes by role. A person without the role sees a plain "no access" page at the
 * same address — no silent redirect — so it is clear what happened and whom to ask.
 * (The server enforces the same rule; this is for people, not for security.)
 */
export function RequireRole({ anyOf }: { anyOf: readonly Role[] }) {
  const me = useSignedInMe();
  if (hasAnyRole(me.roles, anyOf)) return <Outlet />;
  return <Forbidden needed={anyOf} />;
}

export function Forbidden({ needed }: { needed: readonly Role[] }) {
  const names = needed.map((role) => ROLE_LABELS[role]).join(' or ');
  return (
    <Page title="You do not have access" kicker="403 · Not allowed">
      <div className="max-w-prose space-y-4">
        <Notice tone="warning" title="This page needs another role">
          <p>
            Only people with the {names} role can open this page. If you need it, ask an administrator of your team to add the role to
            your account.
          </p>
        </Notice>
        <p>
          <Link to="/">Go to your home page</Link>
        </p>
      </div>
    </Page>
  );
}
