import { useState } from 'react';
import { rolesSchema, type User } from '../../../contract/people';
import type { Role } from '../../../domain/people/roles';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup } from '../../../components/ui/Field';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { errorMessage } from '../../../lib/api';
import { ROLE_OPTIONS } from '../../../lib/roles';
import { useUpdateUser } from '../api/updateUser';

const roleOptions = ROLE_OPTIONS.map(({ value, label }) => ({ value, label }));

export function UsersTable({ users, meId }: { users: readonly User[]; meId: number }) {
  return (
    // Below md each row is drawn as a stacked card (same table markup, so the semantics stay one table);
    // from md up it is a plain table that may scroll sideways inside a focusable, labelled region.
    <div role="region" aria-label="Team members table" tabIndex={0} className="overflow-x-auto rounded-md border-2 border-line">
      <table className="w-full border-collapse text-left max-md:block md:min-w-[44rem]">
        <thead className="bg-sunken max-md:sr-only">
          <tr>
            <th scope="col" className="border-b-2 border-line p-3">
              Person
            </th>
            <th scope="col" className="border-b-2 border-line p-3">
              Roles
            </th>
            <th scope="col" className="border-b-2 border-line p-3">
              Status
            </th>
            <th scope="col" className="border-b-2 border-line p-3">
              Access
            </th>
          </tr>
        </thead>
        <tbody className="max-md:block">
          {users.map((user) => (
<UserRow key={user.id} user={user} isMe={user.id === meId} />
          ))}
        </tbody>
      </table>
    </div>
  );
}

function sameRoles(a: readonly Role[], b: readonly Role[]): boolean {
  return a.length === b.length && a.every((role) => b.includes(role));
}

function UserRow({ user, isMe }: { user: User; isMe: boolean }) {
  const [roles, setRoles] = useState<Role[]>(user.roles);
  // When the server's copy changes (after a save, or another admin's edit) the draft follows it.
  const serverRoles = user.roles.join(',');
  const [syncedRoles, setSyncedRoles] = useState(serverRoles);
  if (syncedRoles !== serverRoles) {
    setSyncedRoles(serverRoles);
    setRoles(user.roles);
  }
  const [roleError, setRoleError] = useState<string | undefined>();
  const [saved, setSaved] = useState<string | null>(null);
  const saveRoles = useUpdateUser();
  const setActive = useUpdateUser();
  const dirty = !sameRoles(roles, user.roles);
  const error = saveRoles.error ?? setActive.error;

  const onSaveRoles = () => {
    setSaved(null);
    const parsed = rolesSchema.safeParse(roles);
    if (!parsed.success) {
      setRoleError(parsed.error.issues[0]?.message ?? 'Choose at least one role');
      return;
    }
    setRoleError(undefined);
    setActive.reset();
    saveRoles.mutate({ id: user.id, roles: parsed.data }, { onSuccess: () => setSaved('Roles saved.') });
  };

  const onToggleActive = () => {
    setSaved(null);
    saveRoles.reset();
    setActive.mutate({ id: user.id, active: !user.active });
  };

  return (
    <tr className="border-b-2 border-line-soft align-top last:border-b-0 max-md:grid max-md:grid-cols-2 max-md:border-line">
      <th scope="row" className="p-3 font-normal max-md:col-span-2 max-md:bg-sunken md:w-60">
        <span className="block font-bold">{user.name}</span>
        <span className="block text-ink-muted [overflow-wrap:anywhere]">{user.email}</span>
        {isMe ? (
          <span className="mt-1 block">
            <Badge glyph="person">You</Badge>
          </span>
        ) : null}
      </th>
      <td className="p-3 max-md:col-span-2">
        <CheckboxGroup
          legend={`Roles for ${user.name}`}
          legendHidden
          layout="wrap"
          options={roleOptions}
          value={roles}
          onChange={(next) => {
            setRoles(next);
            setSaved(null);
            setRoleError(undefined);
          }}
          error={roleError}
          disabled={saveRoles.isPending}
        />
        {isMe && user.roles.includes('admin') && !roles.includes('admin') ? (
          <p className="mt-1 flex gap-1.5 text-caution">
            <Glyph shape="triangle" className="mt-1 size-4" />
            <span>Without Administrator you lose access to this page.</span>
          </p>
        ) : null}
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <Button aria-label={saveRoles.isPending ? undefined : `Save roles for ${user.name}`} onClick={onSaveRoles} pending={saveRoles.isPending} pendingLabel="Saving…" variant={dirty ? 'primary' : 'secondary'}>
            Save roles
          </Button>
          {dirty ? <Badge tone="caution">Not saved yet</Badge> : null}
          {saved && !dirty ? (
            <span role="status">
              <Badge tone="go" glyph="check">
                {saved}
              </Badge>
            </span>
          ) : null}
        </div>
        {error ? (
          <Notice tone="danger" title="Not changed" className="mt-2">
            <p>{errorMessage(error)}</p>
          </Notice>
        ) : null}
      </td>
      <td className="p-3">
        {user.active ? (
          <Badge tone="go" glyph="circle">
            Active
          </Badge>
        ) : (
          <Badge tone="danger" glyph="cross">
            Deactivated
          </Badge>
        )}
      </td>
      <td className="p-3">
        {isMe ? (
          <span className="text-ink-muted">You cannot deactivate yourself.</span>
        ) : (
          <Button
            aria-label={setActive.isPending ? undefined : `${user.active ? 'Deactivate' : 'Activate'} ${user.name}`}
            onClick={onToggleActive}
            pending={setActive.isPending} pendingLabel="Saving…" variant={user.active ? 'danger' : 'secondary'}>
            {user.active ? 'Deactivate' : 'Activate'}
          </Button>
        )}
      </td>
    </tr>
  );
}
