import { useId, useState } from 'react';
import type { HazardDto } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Time } from '../../../components/ui/Time';
import { nextStatuses, type HazardStatus } from '../../../domain/hazards/mitigation';
import { ROLE_LABELS, type Role } from '../../../domain/people/roles';
import { errorMessage } from '../../../lib/api';
import type { Me } from '../../../contract/people';
import { useAcceptHazard } from '../api/acceptHazard';
import { useChangeHazardStatus } from '../api/changeHazardStatus';
import { StatusBadge } from './StatusBadge';

const ACTION_LABELS: Record<HazardStatus, string> = {
  open: 'Reopen',
  mitigating: 'Start mitigating',
  'awaiting-acceptance': 'Ask for acceptance',
  accepted: 'Mark accepted',
  closed: 'Close',
};

const ROLE_AS: Partial<Record<Role, string>> = {
  safety: 'Accept as Safety officer',
  admin: 'Accept as Administrator (test director)',
};

export const ACCEPTANCE_CAUTION =
  'Recording an acceptance here does not make a risk acceptable. Holdfire is a planning and record aid, not a safety authority: ' +
  "the site's governing code and its licensed authority decide what may be accepted and by whom.";

export function StatusPanel({ hazard, me, canEdit }: { hazard: HazardDto; me: Me; canEdit: boolean }) {
  const change = useChangeHazardStatus();
  const accept = useAcceptHazard();
  const noteId = useId();
  const [note, setNote] = useState('');
  const progress = hazard.acceptanceProgress;
  // "accepted" is reached by signatures, not by a button.
  const moves = nextStatuses(hazard.status).filter((s) => s !== 'accepted');
  const error = change.error ?? accept.error;
  const alreadySigned = (role: Role) => hazard.acceptances.some((a) => a.userId === me.id && a.role === role);
  const signedOther = hazard.acceptances.some((a) => a.userId === me.id);
  const canSign = (role: Role) => me.roles.includes(role) && (progress?.missingRoles.includes(role) ?? false) && !alreadySigned(role);

  return (
    <div className="flex flex-col gap-4">
      <p className="flex flex-wrap items-center gap-2">
        <span className="font-bold">Status:</span> <StatusBadge status={hazard.status} />
      </p>
      <div>
        <h3 className="mb-1 text-xl font-bold">Acceptance of the residual risk</h3>
        {progress === null ? (
          <p>No residual risk assessed yet, so there is nothing to accept.</p>
        ) : (
          <>
            <p>
              Needs: {progress.requiredRoles.map((r) => ROLE_LABELS[r]).join(' and ')}
              {progress.requiredRoles.length > 1 ? ', each signed by a different person.' : '.'}
            </p>
            {progress.complete ? (
              <p className="mt-1">
                <Badge tone="go" glyph="check">
                  All acceptances recorded
                </Badge>
              </p>
            ) : (
              <p className="mt-1 flex flex-wrap items-center gap-2">
                <span>Still missing:</span>
                {progress.missingRoles.map((r) => (
                  <Badge key={r} tone="caution" glyph="clock">
                    {ROLE_LABELS[r]}
                  </Badge>
                ))}
              </p>
            )}
          </>
        )}
        {hazard.acceptances.length > 0 ? (
          <ul className="mt-2 list-disc pl-5">
            {hazard.acceptances.map((a) => (
              <li key={`${a.userId}-${a.role}`}>
                {a.userName} as {ROLE_LABELS[a.role]}, <Time value={a.at} />
              </li>
            ))}
          </ul>
        ) : null}
        <Notice tone="warning" title="Not a safety authority" className="mt-3">
          <p>{ACCEPTANCE_CAUTION}</p>
        </Notice>
      </div>

      {canEdit ? (
        <div className="hf-no-print flex flex-col gap-3">
          {error ? (
            <Notice tone="danger" title="Not changed">
              <p>{errorMessage(error)}</p>
            </Notice>
          ) : null}
          {hazard.status === 'awaiting-acceptance' && progress && !progress.complete ? (
            <div className="flex flex-wrap gap-2">
              {(['safety', 'admin'] as const)
                .filter((r) => canSign(r))
                .map((role) => (
                  <Button
                    key={role}
                    variant="primary"
                    pending={accept.isPending && accept.variables?.input.as === role}
                    pendingLabel="Recording…"
                    onClick={() => accept.mutate({ id: hazard.id, input: { as: role } })}
                  >
                    {ROLE_AS[role]}
                  </Button>
                ))}
              {signedOther && !(['safety', 'admin'] as const).some(canSign) ? (
                <p className="text-ink-muted">You have signed; another person must fill the remaining role.</p>
              ) : null}
            </div>
          ) : null}
          {moves.length > 0 ? (
            <div className="flex flex-col gap-2">
              <label htmlFor={noteId} className="font-bold">
                Note for the history (optional)
              </label>
              <input
                id={noteId}
                value={note}
                onChange={(e) => setNote(e.target.value)}
                className="min-h-12 w-full rounded-md border-2 border-line bg-surface px-3 text-ink"
              />
              <div className="flex flex-wrap gap-2">
                {moves.map((to) => (
                  <Button
                    key={to}
                    pending={change.isPending && change.variables?.input.to === to}
                    pendingLabel="Saving…"
                    onClick={() =>
                      change.mutate(
                        { id: hazard.id, input: { to, ...(note.trim() ? { note: note.trim() } : {}) } },
                        { onSuccess: () => setNote('') },
                      )
                    }
                  >
                    {hazard.status === 'awaiting-acceptance' && to === 'mitigating' ? 'Return to mitigating' : ACTION_LABELS[to]}
                  </Button>
                ))}
              </div>
            </div>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
