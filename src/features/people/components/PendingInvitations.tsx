import type { Invitation } from '../../../contract/people';
import { Badge } from '../../../components/ui/Badge';
import { Time } from '../../../components/ui/Time';
import { isPast } from '../../../lib/dates';
import { roleList } from '../../../lib/roles';

export function PendingInvitations({ invitations }: { invitations: readonly Invitation[] }) {
  const pending = invitations
    .filter((invitation) => invitation.acceptedAt === null)
    .sort((a, b) => Date.parse(b.createdAt) - Date.parse(a.createdAt));

  if (pending.length === 0) return <p className="text-ink-muted">No invitations are waiting. Accepted invitations leave this list.</p>;

  return (
    <ul className="flex flex-col gap-3">
      {pending.map((invitation) => {
        const expired = isPast(invitation.expiresAt);
        return (
          <li key={invitation.id} className="rounded-md border-2 border-line-soft p-3">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <span className="break-all font-bold">{invitation.email}</span>
              {expired ? (
                <Badge tone="danger" glyph="cross">
                  Expired
                </Badge>
              ) : (
                <Badge tone="caution" glyph="clock">
                  Pending
                </Badge>
              )}
            </div>
            <p>{roleList(invitation.roles)}</p>
            <p className="text-sm text-ink-muted">
              Sent <Time value={invitation.createdAt} /> · {expired ? 'Expired' : 'Expires'} <Time value={invitation.expiresAt} relative />
            </p>
            {expired ? <p className="text-sm">Invite the same address again to send a fresh link.</p> : null}
          </li>
        );
      })}
    </ul>
  );
}
