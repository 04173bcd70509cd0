import { Link, useSearchParams } from 'react-router-dom';
import { Badge } from '../../../components/ui/Badge';
import { buttonClasses } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { SelectField } from '../../../components/ui/SelectField';
import type { AnomalyListQuery, AnomalySummaryDto } from '../../../contract/anomalies';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useAnomalies } from '../api/listAnomalies';
import { useCountChoices } from '../api/listCountChoices';
import { canReport, STATUS_LOOK, wallTime } from '../lib/format';

/** Where and when, in one line: "Kestrel-2 short run · T-0:14 (holding)" or "Outside a count". */
export function instantWords(a: Pick<AnomalySummaryDto, 'countId' | 'countName' | 'tText' | 'countStatus'>): string {
  if (a.countId === null) return 'Outside a count';
  const t = a.tText ?? 'before the count started';
  return `${a.countName ?? `Count ${a.countId}`} · ${t}${a.countStatus && a.tText ? ` (${a.countStatus})` : ''}`;
}

function AnomalyItem({ a }: { a: AnomalySummaryDto }) {
  const look = STATUS_LOOK[a.status];
  return (
    <li className="flex min-w-0 flex-col gap-1 rounded-md border-2 border-line bg-surface p-3">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-mono font-bold">{a.ref}</span>
        <Badge tone={look.tone} glyph={look.glyph}>
          {look.word}
        </Badge>
        <span className="text-sm font-bold">Severity {a.severityLabel}</span>
      </div>
      <h2 className="text-lg font-bold [overflow-wrap:anywhere]">
        <Link to={`/anomalies/${a.id}`}>{a.title}</Link>
      </h2>
      <p className="text-sm [overflow-wrap:anywhere]">
        {instantWords(a)} · <time dateTime={a.at}>{wallTime(a.atMs)}</time>
      </p>
      <p className="text-sm text-ink-muted">
        {a.openActions === 0 ? 'No corrective action open' : `${a.openActions} corrective action${a.openActions === 1 ? '' : 's'} not done`}
        {a.hazardIds.length ? ` · ${a.hazardIds.length} hazard${a.hazardIds.length === 1 ? '' : 's'} linked` : ''}
        {a.reportedBy ? ` · reported by ${a.reportedBy}` : ''}
      </p>
    </li>
  );
}

export function AnomaliesPage() {
  const me = useSignedInMe();
  const [params, setParams] = useSearchParams();
  const status = params.get('status') ?? '';
  const countId = params.get('countId') ?? '';
  const filters: AnomalyListQuery = {
    ...(status === 'open' || status === 'closed' ? { status } : {}),
    ...(/^\d+$/.test(countId) ? { countId } : {}),
  };
  const list = useAnomalies(filters);
  const counts = useCountChoices();
  const setFilter = (key: string, value: string) =>
    setParams((p) => {
      const next = new URLSearchParams(p);
      if (value) next.set(key, value);
      else next.delete(key);
      return next;
    });

  return (
    <Page
      title="Anomalies"
      kicker="After the count"
      lead={<p>What went wrong during a count or was found outside one, what was done about it, and what changed because of it.</p>}
      actions={
        canReport(me.roles) ? (
          <Link to="/anomalies/new" className={buttonClasses('primary')}>
            Report anomaly
          </Link>
        ) : undefined
      }
    >
      <form aria-label="Filter anomalies" className="mb-4 grid gap-3 sm:grid-cols-2" onSubmit={(e) => e.preventDefault()}>
        <SelectField
          label="Status"
          placeholder="Open and closed"
          options={[
            { value: 'open', label: 'Open' },
            { value: 'closed', label: 'Closed' },
          ]}
          value={status}
          onChange={(e) => setFilter('status', e.target.value)}
        />
        <SelectField
          label="Count"
          placeholder="Any count, or none"
          options={(counts.data ?? []).map((c) => ({ value: String(c.id), label: c.name }))}
          value={countId}
          onChange={(e) => setFilter('countId', e.target.value)}
        />
      </form>
      {list.isPending ? <Loading label="Loading the anomalies…" /> : null}
      {list.isError ? (
        <Notice tone="danger" title="Could not load the anomalies">
          <p>{errorMessage(list.error)}</p>
        </Notice>
      ) : null}
      {list.data ? (
        <>
          <p role="status" className="mb-2 text-ink-muted">
            {list.data.length === 0 ? 'No anomaly matches.' : `${list.data.length} ${list.data.length === 1 ? 'anomaly' : 'anomalies'}.`}
          </p>
          <ul className="flex flex-col gap-3" aria-label="Anomalies">
            {list.data.map((a) => (
              <AnomalyItem key={a.id} a={a} />
            ))}
          </ul>
        </>
      ) : null}
    </Page>
  );
}
