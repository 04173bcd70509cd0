import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { useHazardHistory } from '../api/getHazardHistory';

function show(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string') return value;
  if (Array.isArray(value) && value.every((v) => typeof v === 'string')) return value.join('; ');
  if (typeof value === 'object') {
    return Object.entries(value as Record<string, unknown>)
      .map(([k, v]) => `${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`)
      .join('; ');
  }
  return String(value);
}

const FIELD_WORDS: Record<string, string> = {
  initialSeverity: 'Initial severity',
  initialLikelihood: 'Initial likelihood',
  residualSeverity: 'Residual severity',
  residualLikelihood: 'Residual likelihood',
};

function fieldName(field: string): string {
  // 'mitigation:3' or 'mitigation:3.owner'
  const m = /^mitigation:(\d+)(?:\.(.+))?$/.exec(field);
  if (m) return `Mitigation ${m[1]}${m[2] ? `, ${m[2]}` : ''}`;
  return FIELD_WORDS[field] ?? field.charAt(0).toUpperCase() + field.slice(1);
}

/** Who changed what and when, oldest change last. Readable by every role, auditors included. */
export function HistoryPanel({ hazardId }: { hazardId: number }) {
  const history = useHazardHistory(hazardId);
  if (history.isPending) return <Loading label="Loading history…" />;
  if (history.isError)
    return (
      <Notice tone="danger" title="Could not load the history">
        <p>{errorMessage(history.error)}</p>
      </Notice>
    );
  if (history.data.length === 0) return <p>No changes recorded yet.</p>;
  return (
    <div role="region" aria-labelledby={`history-caption-${hazardId}`} tabIndex={0} className="overflow-x-auto rounded-md border-2 border-line-soft">
      <table className="w-full min-w-[40rem] border-collapse text-left">
        <caption id={`history-caption-${hazardId}`} className="p-2 text-left text-ink-muted">
          Every change to this hazard, newest first.
        </caption>
        <thead className="bg-sunken">
          <tr>
            <th scope="col" className="p-2">
              When
            </th>
            <th scope="col" className="p-2">
              Who
            </th>
            <th scope="col" className="p-2">
              Field
            </th>
            <th scope="col" className="p-2">
              Before
            </th>
            <th scope="col" className="p-2">
              After
            </th>
          </tr>
        </thead>
        <tbody>
          {[...history.data].reverse().map((h) => (
            <tr key={h.id} className="border-t-2 border-line-soft align-top">
              <td className="p-2 whitespace-nowrap">
                <Time value={h.at} />
              </td>
              <td className="p-2">{h.userName}</td>
              <td className="p-2">{fieldName(h.field)}</td>
              <td className="p-2 [overflow-wrap:anywhere]">{show(h.before)}</td>
              <td className="p-2 [overflow-wrap:anywhere]">{show(h.after)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
