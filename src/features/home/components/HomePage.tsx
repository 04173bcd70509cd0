import { Link } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '../../../domain/people/roles';
import { Badge } from '../../../components/ui/Badge';
import { Page } from '../../../components/ui/Page';
import { useSignedInMe } from '../../../lib/session';

interface Area {
  to: string;
  label: string;
  /** Areas still to be built are marked so, instead of hinting at content that is not there. */
  built: boolean;
}

const AREAS = {
  hazards: { to: '/hazards', label: 'Hazard register', built: true },
  procedures: { to: '/procedures', label: 'Procedures', built: true },
  counts: { to: '/counts', label: 'Live count', built: true },
  records: { to: '/records', label: 'Replay and reports', built: false },
  people: { to: '/admin/people', label: 'People', built: true },
  mail: { to: '/admin/mail', label: 'Mail outbox', built: true },
  profile: { to: '/profile', label: 'Profile', built: true },
} satisfies Record<string, Area>;

const ORIENTATION: Record<Role, { summary: string; areas: Area[] }> = {
  admin: {
    summary:
      'You look after who is on the team. Invite people by e-mail, give each the roles they need, and deactivate accounts that should no longer sign in.',
    areas: [AREAS.people, AREAS.mail],
  },
  conductor: {
    summary:
      'You run the test. You prepare procedures with the team, call the countdown, poll each station for go or no-go, and call holds when something is not right.',
    areas: [AREAS.procedures, AREAS.counts, AREAS.hazards],
  },
  safety: {
    summary:
      'You keep the hazard analysis: what can go wrong with propellants, pressure and the stand, and which controls must be in place before a count.',
    areas: [AREAS.hazards, AREAS.procedures, AREAS.counts],
  },
  operator: {
    summary:
      'You answer for a station (propellants, pad systems, data, range). During a count you answer polls with go or no-go from your phone or a laptop.',
    areas: [AREAS.counts, AREAS.procedures],
  },
  auditor: {
    summary: 'You review what happened. You can read counts and records after the fact; you cannot change anything.',
    areas: [AREAS.records, AREAS.hazards],
  },
};

export function HomePage() {
  const me = useSignedInMe();
  return (
    <Page
      title={`Welcome, ${me.name}`}
      documentTitle="Home"
      lead={<p>Holdfire holds your team's hazard analysis, procedures, live countdown and the record of every count.</p>}
    >
      <h2 className="mb-3 text-2xl font-bold">{me.roles.length === 1 ? 'Your role' : 'Your roles'}</h2>
      <ul className="grid gap-4 md:grid-cols-2">
        {me.roles.map((role) => (
          <li key={role} className="rounded-md border-2 border-line bg-surface p-4">
            <h3 className="text-xl font-bold">{ROLE_LABELS[role]}</h3>
            <p className="mt-2">{ORIENTATION[role].summary}</p>
            <ul className="mt-3 flex flex-col gap-2" aria-label={`Areas for ${ROLE_LABELS[role]}`}>
              {ORIENTATION[role].areas.map((area) => (
                <li key={area.to} className="flex flex-wrap items-center gap-2">
                  <Link to={area.to} className="inline-flex min-h-11 items-center font-bold">
                    {area.label}
                  </Link>
                  {area.built ? null : (
                    <Badge tone="caution" glyph="clock">
                      Not built yet
                    </Badge>
                  )}
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
      <p className="mt-6 max-w-prose text-ink-muted">
        Your name, password and theme are on your <Link to="/profile">profile</Link>.
      </p>
    </Page>
  );
}
