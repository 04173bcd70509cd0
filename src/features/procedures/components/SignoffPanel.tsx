import { useState } from 'react';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Time } from '../../../components/ui/Time';
import type { RevisionDto, SignoffRole } from '../../../contract/procedures';
import type { Me } from '../../../contract/people';
import { SIGNOFF_ROLES } from '../../../domain/procedures/release';
import { errorMessage } from '../../../lib/api';
import { useSignRevision } from '../api/signRevision';
import { canSignAs, RELEASE_CAUTION, SIGNOFF_LABELS } from '../lib/format';

/**
 * The two-person release: one sign-off as test conductor and one as safety officer, by two different people.
 * Signing asks once more, because the name and time are recorded against this exact content.
 */
export function SignoffPanel({ revision: r, me }: { revision: RevisionDto; me: Me }) {
  const sign = useSignRevision();
  const [confirming, setConfirming] = useState<SignoffRole | null>(null);
  const released = r.status === 'released';
  const mine = r.signoffs.find((s) => s.userId === me.id);

  return (
    <div className="flex flex-col gap-4">
      <Notice tone="warning" title="Release does not replace your site’s approvals">
        <p>{RELEASE_CAUTION}</p>
      </Notice>
      {released ? (
        <Notice tone="success" title={`Revision ${r.number} is released`} announce={undefined}>
          <p>
            Released {r.releasedAt ? <Time value={r.releasedAt} /> : null}. It is frozen: nothing in it can change. To change the procedure, open a
            new draft from the procedure page.
          </p>
        </Notice>
      ) : (
        <p className="max-w-prose">
          Release needs two sign-offs by two different people: one as test conductor and one as safety officer. The second signature
          releases the revision. Saving a change to the draft clears any signature already given.
        </p>
      )}
      <ul className="grid gap-3 md:grid-cols-2" aria-label="Sign-offs">
        {SIGNOFF_ROLES.map((role) => {
          const done = r.signoffs.find((s) => s.role === role);
          const label = SIGNOFF_LABELS[role];
          return (
            <li key={role} className="flex flex-col gap-2 rounded-md border-2 border-line p-3">
              <p className="text-lg font-bold">{label}</p>
              {done ? (
                <p className="flex flex-wrap items-center gap-2">
                  <Badge tone="go" glyph="check">
                    Signed
                  </Badge>
                  <span>
                    {done.userName}, <Time value={done.at} />
                  </span>
                </p>
              ) : released ? null : (
                <>
                  <p className="flex flex-wrap items-center gap-2">
                    <Badge tone="neutral" glyph="dash">
                      Not signed yet
                    </Badge>
                  </p>
                  {canSignAs(me.roles, role) ? (
                    mine ? (
                      <p className="text-ink-muted">
                        You signed as {SIGNOFF_LABELS[mine.role].toLowerCase()}. Another person must sign as {label.toLowerCase()}.
                      </p>
                    ) : confirming === role ? (
                      <div className="flex flex-col gap-2 rounded-md border-2 border-line-soft p-2">
                        <p>
                          Sign revision {r.number} as {label.toLowerCase()}? Your name and the time are recorded against the steps and cautions as they
                          stand now.
                        </p>
                        <div className="flex flex-wrap gap-2">
                          <Button
                            variant="primary"
                            pending={sign.isPending}
                            pendingLabel="Signing…"
                            onClick={() =>
                              sign.mutate({ procedureId: r.procedureId, rev: r.number, as: role }, { onSuccess: () => setConfirming(null) })
                            }
                          >
                            Confirm signature
                          </Button>
                          <Button variant="quiet" onClick={() => setConfirming(null)}>
                            Cancel
                          </Button>
                        </div>
                      </div>
                    ) : (
                      <div>
                        <Button
                          variant="primary"
                          onClick={() => {
                            sign.reset();
                            setConfirming(role);
                          }}
                        >
                          Sign as {label.toLowerCase()}
                        </Button>
                      </div>
                    )
                  ) : (
                    <p className="text-ink-muted">Waiting for a {label.toLowerCase()} to sign.</p>
                  )}
                </>
              )}
            </li>
          );
        })}
      </ul>
      {sign.isError ? (
        <Notice tone="danger" title="Not signed">
          <p>{errorMessage(sign.error)}</p>
        </Notice>
      ) : null}
    </div>
  );
}
