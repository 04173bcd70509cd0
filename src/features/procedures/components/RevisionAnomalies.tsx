import { Link } from 'react-router-dom';
import type { AnomalySummaryDto } from '../../../contract/anomalies';

/** "Revision 3 drafted because of anomaly AN-002 Fuel inlet pressure spike", one line per anomaly. */
export function revisionAnomalyLines(anomalies: readonly AnomalySummaryDto[], procedureId: number, revisionNumber: number) {
  return anomalies.flatMap((a) =>
    a.revisions
      .filter((r) => r.procedureId === procedureId && r.revisionNumber === revisionNumber)
      .map((r) => ({ anomaly: a, drafted: r.drafted })),
  );
}

export function RevisionAnomalies({ anomalies, procedureId, revisionNumber }: { anomalies: readonly AnomalySummaryDto[]; procedureId: number; revisionNumber: number }) {
  const lines = revisionAnomalyLines(anomalies, procedureId, revisionNumber);
  if (lines.length === 0) return null;
  return (
    <ul className="mt-2 flex flex-col gap-1">
      {lines.map(({ anomaly, drafted }) => (
        <li key={anomaly.id} className="[overflow-wrap:anywhere]">
          Revision {revisionNumber} {drafted ? 'drafted because of' : 'linked to'} anomaly{' '}
          <Link to={`/anomalies/${anomaly.id}`} className="font-bold">
            {anomaly.ref} {anomaly.title}
          </Link>
        </li>
      ))}
    </ul>
  );
}
