import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { errorMessage } from '../../../lib/api';
import { useHazardAnomalies } from '../api/listHazardAnomalies';

/** The anomalies linked to this hazard, and the procedure revisions each one caused. */
export function HazardAnomalies({ hazardId }: { hazardId: number }) {
  const list = useHazardAnomalies(hazardId);
  if (list.isPending) return <Loading label="Loading the anomalies…" />;
  if (list.isError)
    return (
      <Notice tone="danger" title="Could not load the anomalies">
        <p>{errorMessage(list.error)}</p>
      </Notice>
    );
  if (list.data.length === 0) return <p>No anomaly is linked to this hazard.</p>;
  return (
    <ul className="flex flex-col gap-3" aria-label="Anomalies linked to this hazard">
      {list.data.map((a) => (
        <li key={a.id} className="[overflow-wrap:anywhere]">
          <Link to={`/anomalies/${a.id}`} className="font-bold">
            {a.ref} {a.title}
          </Link>{' '}
          <span className="text-ink-muted">
            ({a.status}, severity {a.severityLabel}
            {a.countName ? `, ${a.countName}${a.tText ? ` at ${a.tText}` : ''}` : ''})
          </span>
          {a.revisions.length ? (
            <ul className="ml-4 mt-1 list-disc">
              {a.revisions.map((r) => (
                <li key={`${r.procedureId}-${r.revisionNumber}`}>
                  <Link to={`/procedures/${r.procedureId}/revisions/${r.revisionNumber}`}>
                    {r.procedureName}, revision {r.revisionNumber}
                  </Link>{' '}
                  {r.drafted ? 'drafted because of it' : 'linked to it'}
                </li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
