import { ROLE_LABELS } from '../../../domain/people/roles';
import { Badge } from '../../../components/ui/Badge';
import { Page, Section } from '../../../components/ui/Page';
import { ROLE_DUTIES } from '../../../lib/roles';
import { useSignedInMe } from '../../../lib/session';
import { ChangeNameForm } from './ChangeNameForm';
import { ChangePasswordForm } from './ChangePasswordForm';
import { NotificationChoices } from './NotificationChoices';
import { ThemeChoice } from './ThemeChoice';

export function ProfilePage() {
  const me = useSignedInMe();
  return (
    <Page title="Profile" kicker="Your account">
      <div className="grid gap-6 lg:grid-cols-2">
        <Section title="Your details">
          <dl className="grid gap-x-4 gap-y-3 sm:grid-cols-[auto_1fr]">
            <dt className="font-bold">Name</dt>
            <dd>{me.name}</dd>
            <dt className="font-bold">E-mail</dt>
            <dd className="break-all">{me.email}</dd>
            <dt className="font-bold">Roles</dt>
            <dd>
              <ul className="flex flex-col gap-2">
                {me.roles.map((role) => (
                  <li key={role}>
                    <Badge glyph="person">{ROLE_LABELS[role]}</Badge>
                    <span className="mt-0.5 block text-ink-muted">{ROLE_DUTIES[role]}</span>
                  </li>
                ))}
              </ul>
            </dd>
          </dl>
          <p className="mt-4 text-ink-muted">Only an administrator can change your e-mail address or roles.</p>
        </Section>
        <Section title="Theme">
          <ThemeChoice />
        </Section>
        <Section title="Change name">
          <ChangeNameForm currentName={me.name} />
        </Section>
        <Section title="Change password">
          <ChangePasswordForm />
        </Section>
        <Section title="E-mail notices">
          <NotificationChoices />
        </Section>
      </div>
    </Page>
  );
}
