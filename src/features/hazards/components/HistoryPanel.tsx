import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { useHazardHistory } from '../api/getHazardHistory';
import { historyFieldName, historyValue } from '../lib/history';

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
              <td className="p-2">{historyFieldName(h.field)}</td>
              <td className="p-2 [overflow-wrap:anywhere]">{historyValue(h.field, h.before)}</td>
              <td className="p-2 [overflow-wrap:anywhere]">{historyValue(h.field, h.after)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
