import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { usePropellantHistory } from '../api/getPropellantHistory';
import { describeCautionEdit } from '../lib/cautionDiff';

/** Every edit of a propellant's cautions and PPE, newest first, in words. Readable by every role. */
export function PropellantCautionHistory({ propellantId }: { propellantId: string }) {
  const history = usePropellantHistory(propellantId);
  if (history.isPending) return <Loading label="Loading the history…" />;
  if (history.isError)
    return (
      <Notice tone="danger" title="Could not load the history">
        <p>{errorMessage(history.error)}</p>
      </Notice>
    );
  if (history.data.length === 0) return <p>No changes yet: these are the library&apos;s own cautions and PPE.</p>;
  return (
    <ol className="flex flex-col gap-4" aria-label="Changes, newest first">
      {[...history.data].reverse().map((entry) => {
        const changes = describeCautionEdit(entry.before, entry.after);
        return (
          <li key={entry.id} className="rounded-md border-2 border-line-soft p-3">
            <p className="font-bold">
              <Time value={entry.at} /> · {entry.userName}
            </p>
            {changes.length === 0 ? (
              <p className="text-ink-muted">Saved without a change.</p>
            ) : (
              <ul className="mt-2 flex flex-col gap-3">
                {changes.map((c, i) => (
                  <li key={i} className="min-w-0">
                    <p className="font-bold">{c.what}</p>
                    <p className="[overflow-wrap:anywhere]">
                      <span className="font-bold">Before: </span>
                      {c.before ?? <span className="text-ink-muted">(not there)</span>}
                    </p>
                    <p className="[overflow-wrap:anywhere]">
                      <span className="font-bold">After: </span>
                      {c.after ?? <span className="text-ink-muted">(removed)</span>}
                    </p>
                  </li>
                ))}
              </ul>
            )}
          </li>
        );
      })}
    </ol>
  );
}
