import { format } from 'date-fns';
import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { HOLD_CATEGORY_LABELS, type HoldCategory } from '../../../domain/count/events';
import { formatTMinus } from '../../../domain/procedures/tminus';
import { errorMessage } from '../../../lib/api';
import { useCountReport, type CountReportDto } from '../api/getCountReport';

const when = (ms: number | null) => (ms === null ? '—' : format(ms, 'yyyy-MM-dd HH:mm:ss'));
/** 430 -> '7 min 10 s'; 3725 -> '1 h 2 min 5 s'. */
function secs(s: number): string {
  const total = Math.round(s);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const r = total % 60;
  return [h ? `${h} h` : '', m ? `${m} min` : '', r || (!h && !m) ? `${r} s` : ''].filter(Boolean).join(' ');
}

function slipWords(slip: number | null): string {
  if (slip === null) return 'T-0 was not reached';
  if (Math.round(slip) === 0) return 'on time';
  return `${secs(Math.abs(slip))} ${slip > 0 ? 'late' : 'early'}`;
}

/** What a count came to, from its log: printable, for the debrief and the file. */
export function CountReportPage() {
  const { id } = useParams();
  const countId = Number(id);
  const report = useCountReport(countId);
  useEffect(() => {
    if (report.data) document.title = `Count report: ${report.data.countName} · Holdfire`;
  }, [report.data]);
  if (report.isPending) return <Loading label="Reading the count log…" />;
  if (report.isError)
    return (
      <Page title="Count report">
        <Notice tone="danger" title="Could not make the report">
          <p>{errorMessage(report.error)}</p>
        </Notice>
      </Page>
    );
  return <Report r={report.data} />;
}

function Report({ r }: { r: CountReportDto }) {
  const categories = Object.entries(r.holds.byCategory) as [HoldCategory, number][];
  return (
    <Page title={`Count report: ${r.countName}`} kicker={`${r.procedureName} · ${r.status}`}>
      <div className="hf-no-print mb-4 flex flex-wrap items-center gap-3">
        <Button variant="primary" onClick={() => window.print()}>
          Print this report
        </Button>
        <Link to={`/counts/${r.countId}`}>Back to the count</Link>
        <Link to={`/counts/${r.countId}/data`}>Sensor data</Link>
      </div>
      <div className="flex flex-col gap-6">
        <section aria-labelledby="r-t0">
          <h2 id="r-t0" className="mb-2 text-2xl font-bold">
            T-0, planned and actual
          </h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            <dt className="font-bold">Started</dt>
            <dd>
              {when(r.startedAt)}
              {r.startedAtT !== null ? ` at ${formatTMinus(r.startedAtT)}` : ''}
            </dd>
            <dt className="font-bold">Planned T-0</dt>
            <dd>{when(r.plannedT0At)} (no unplanned hold; built-in holds as written)</dd>
            <dt className="font-bold">Actual T-0</dt>
            <dd>{when(r.actualT0At)}</dd>
            <dt className="font-bold">Difference</dt>
            <dd>{slipWords(r.slipSeconds)}</dd>
            {r.scrub ? (
              <>
                <dt className="font-bold">Scrubbed</dt>
                <dd>
                  {when(r.scrub.at)} at {formatTMinus(Math.round(r.scrub.atT))} by {r.scrub.by?.name ?? 'the count'}: {HOLD_CATEGORY_LABELS[r.scrub.category]}, {r.scrub.reason}
                </dd>
              </>
            ) : null}
          </dl>
        </section>

        <section aria-labelledby="r-holds">
          <h2 id="r-holds" className="mb-2 text-2xl font-bold">
            Holds
          </h2>
          <p>
            {r.holds.count} hold{r.holds.count === 1 ? '' : 's'}, the count stood {secs(r.holds.totalSeconds)} on them
            {categories.length ? `: ${categories.map(([c, s]) => `${HOLD_CATEGORY_LABELS[c]} ${secs(s)}`).join(', ')}` : ''}. Built-in holds: {r.builtInHolds.count}, {secs(r.builtInHolds.totalSeconds)}.
          </p>
          {r.holds.list.length ? (
            <div className="overflow-x-auto">
              <table className="mt-2 w-full border-collapse text-left">
                <caption className="sr-only">Each hold</caption>
                <thead>
                  <tr className="border-b-2 border-line">
                    <th className="p-1">Hold</th>
                    <th className="p-1">At</th>
                    <th className="p-1">Called by</th>
                    <th className="p-1">Why</th>
                    <th className="p-1">Stood</th>
                  </tr>
                </thead>
                <tbody>
                  {r.holds.list.map((h) => (
                    <tr key={h.holdId} className="border-b border-line-soft align-top">
                      <td className="p-1 font-bold">{h.holdId}</td>
                      <td className="p-1 whitespace-nowrap">{formatTMinus(Math.round(h.calledAtT))}</td>
                      <td className="p-1">{h.calledByStation ? `${h.calledByStation}${h.calledBy ? ` (${h.calledBy.name})` : ''}` : (h.calledBy?.name ?? h.source)}</td>
                      <td className="p-1">
                        {HOLD_CATEGORY_LABELS[h.category]}: {h.reason}
                      </td>
                      <td className="p-1 whitespace-nowrap">{secs(h.seconds)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
        </section>

        <section aria-labelledby="r-recycles">
          <h2 id="r-recycles" className="mb-2 text-2xl font-bold">
            Recycles
          </h2>
          {r.recycles.length === 0 ? <p>None.</p> : null}
          <ul className="list-disc pl-6">
            {r.recycles.map((c) => (
              <li key={c.at}>
                {when(c.at)}: from {formatTMinus(Math.round(c.fromT))} to {formatTMinus(c.toT)} by {c.by?.name ?? 'the conductor'}: {c.reason}
              </li>
            ))}
          </ul>
        </section>

        <section aria-labelledby="r-polls">
          <h2 id="r-polls" className="mb-2 text-2xl font-bold">
            Go/no-go polls
          </h2>
          <p>
            {r.polls.count} poll{r.polls.count === 1 ? '' : 's'}: {r.polls.passed} passed, {r.polls.failed} failed, {r.polls.cancelled} cancelled by a recycle or scrub.
          </p>
          {r.polls.stations.length ? (
            <div className="overflow-x-auto">
              <table className="mt-2 w-full border-collapse text-left">
                <caption className="sr-only">Answers per station</caption>
                <thead>
                  <tr className="border-b-2 border-line">
                    <th className="p-1">Station</th>
                    <th className="p-1">Asked</th>
                    <th className="p-1">Answered</th>
                    <th className="p-1">NO-GO</th>
                    <th className="p-1">Missed</th>
                    <th className="p-1">Median answer</th>
                    <th className="p-1">Slowest</th>
                  </tr>
                </thead>
                <tbody>
                  {r.polls.stations.map((s) => (
                    <tr key={s.station} className="border-b border-line-soft">
                      <td className="p-1 font-bold">{s.station}</td>
                      <td className="p-1">{s.asked}</td>
                      <td className="p-1">{s.answered}</td>
                      <td className="p-1">{s.nogo}</td>
                      <td className="p-1">{s.missed}</td>
                      <td className="p-1">{s.medianResponseMs === null ? '—' : `${(s.medianResponseMs / 1000).toFixed(1)} s`}</td>
                      <td className="p-1">{s.maxResponseMs === null ? '—' : `${(s.maxResponseMs / 1000).toFixed(1)} s`}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
        </section>

        <section aria-labelledby="r-redlines">
          <h2 id="r-redlines" className="mb-2 text-2xl font-bold">
            Readings out of limits
          </h2>
          {r.redlines.length === 0 ? <p>None.</p> : null}
          <ul className="list-disc pl-6">
            {r.redlines.map((x) => (
              <li key={`${x.stepKey}-${x.at}`}>
                {formatTMinus(Math.round(x.t))} ({when(x.at)}), {x.station}: {x.message}
              </li>
            ))}
          </ul>
        </section>

        <section aria-labelledby="r-crew">
          <h2 id="r-crew" className="mb-2 text-2xl font-bold">
            Crew
          </h2>
          <ul className="grid gap-1 sm:grid-cols-2">
            {r.crew.map((c) => (
              <li key={c.station}>
                <span className="font-bold">{c.station}</span>: {c.names.join(', ') || 'not manned'}
              </li>
            ))}
          </ul>
        </section>

        <section aria-labelledby="r-record">
          <h2 id="r-record" className="mb-2 text-2xl font-bold">
            The record
          </h2>
          <p>
            {r.events} events in the log. Last hash: <code className="break-all">{r.lastHash ?? '—'}</code>. Keep this page with the test records: the same
            log exported later must end in the same hash.
          </p>
        </section>
      </div>
    </Page>
  );
}
