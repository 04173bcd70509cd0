import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useInvitations } from '../api/listInvitations';
import { useUsers } from '../api/listUsers';
import { InviteForm } from './InviteForm';
import { PendingInvitations } from './PendingInvitations';
import { UsersTable } from './UsersTable';

export function PeoplePage() {
  const me = useSignedInMe();
  const users = useUsers();
  const invitations = useInvitations();

  return (
    <Page title="People" kicker="Administration" lead={<p>Who is on the team, what each person may do, and who is still to join.</p>}>
      <div className="flex flex-col gap-6">
        <Section title="Team members">
          {users.isPending ? (
            <Loading label="Loading team members…" />
          ) : users.isError ? (
            <LoadProblem error={users.error} retry={() => void users.refetch()} />
          ) : (
            <UsersTable users={users.data} meId={me.id} />
          )}
        </Section>
        <div className="grid gap-6 lg:grid-cols-2">
          <Section title="Invite someone">
            <InviteForm />
          </Section>
          <Section title="Pending invitations">
            {invitations.isPending ? (
              <Loading label="Loading invitations…" />
            ) : invitations.isError ? (
              <LoadProblem error={invitations.error} retry={() => void invitations.refetch()} />
            ) : (
              <PendingInvitations invitations={invitations.data} />
            )}
          </Section>
        </div>
      </div>
    </Page>
  );
}

function LoadProblem({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <Notice tone="danger" title="Could not load">
      <p>{errorMessage(error)}</p>
      <Button className="mt-2" onClick={retry}>
        Try again
      </Button>
    </Notice>
  );
}
