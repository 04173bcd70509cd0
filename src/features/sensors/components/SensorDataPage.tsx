import { useEffect, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { SENSOR_WRITERS, type SensorDataDto, type SensorDatasetDto, type SensorListDto } from '../../../contract/sensors';
import { hasAnyRole } from '../../../domain/people/roles';
import { mergeDetail, type PlotColumns } from '../../../domain/sensors/decimate';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { SelectField } from '../../../components/ui/SelectField';
import { errorMessage } from '../../../lib/api';
import { useMe } from '../../../lib/session';
import { useSensorData, useSensorWindow } from '../api/getSensorData';
import type { SensorWindow } from '../api/keys';
import { useSensorList } from '../api/listSensorData';
import { formatT } from './format';
import { LimitsEditor, RemoveDataset, UploadSensorForm } from './SensorForms';
import { SensorPlot, seriesLook, type PlotSeries } from './SensorPlot';
import { SensorSummaryTable } from './SensorSummaryTable';

/** Rows the plot asks for: about two per pixel column of a wide screen, few enough to stay quick on a phone. */
export const PLOT_POINTS = 4000;

/** The count's test data, plotted on its timeline, with the same readings in a table. */
export function SensorDataPage() {
  const countId = Number(useParams().id);
  const list = useSensorList(countId);
  const me = useMe();
  const canWrite = me.data ? hasAnyRole(me.data.roles, SENSOR_WRITERS) : false;
  const [chosen, setChosen] = useState<number | null>(null);
  const datasets = list.data?.datasets ?? [];
  const dataset = datasets.find((d) => d.id === chosen) ?? datasets[0] ?? null;

  if (list.isPending) return <Loading label="Reading the count’s sensor data…" />;
  if (list.isError)
    return (
      <Page title="Sensor data">
        <Notice tone="danger" title="Could not load the sensor data">
          <p>{errorMessage(list.error)}</p>
        </Notice>
      </Page>
    );
  const l = list.data;
  return (
    <Page
      title={`Sensor data: ${l.countName}`}
      kicker="After the count"
      actions={
        <>
          <Link to={`/counts/${countId}/replay`}>Replay</Link>
          <Link to={`/counts/${countId}/report`}>Count report</Link>
        </>
      }
    >
      <div className="flex min-w-0 flex-col gap-6">
        <Notice tone="warning" title="For review only">
          <p>
            These plots are for looking back at a test. They are not a safety authority: decisions on the stand follow your procedures, your instruments and
            your safety officer, never this page.
          </p>
        </Notice>
        <TimelineWords timeline={l.timeline} />
        {datasets.length === 0 ? <p>No sensor data has been added to this count yet.</p> : null}
        {datasets.length > 1 ? (
          <SelectField
            label="Dataset"
            value={String(dataset?.id ?? '')}
            onChange={(e) => setChosen(Number(e.target.value))}
            options={datasets.map((d) => ({ value: String(d.id), label: `${d.file.name} (${d.channels.length} channels)` }))}
            className="max-w-md"
          />
        ) : null}
        {dataset ? <DatasetView key={dataset.id} countId={countId} dataset={dataset} timeline={l.timeline} canWrite={canWrite} /> : null}
        {canWrite ? <UploadSensorForm countId={countId} hasT0={l.timeline.t0At !== null} onUploaded={(d) => setChosen(d.id)} /> : null}
      </div>
    </Page>
  );
}

function TimelineWords({ timeline }: { timeline: SensorListDto['timeline'] }) {
  return (
    <section aria-labelledby="sd-timeline">
      <h2 id="sd-timeline" className="mb-2 text-2xl font-bold">
        The count’s timeline
      </h2>
      <ul className="list-disc pl-6">
        <li>
          {timeline.t0At === null
            ? 'This count never reached T-0. Times are seconds on the count clock; wall-clock files cannot be placed.'
            : `T-0 was reached at ${new Date(timeline.t0At).toISOString().replace('T', ' ').slice(0, 19)} UTC. Times are seconds of wall-clock time from then.`}
        </li>
        {timeline.holds.map((h) => (
          <li key={h.holdId}>
            Hold {h.holdId} ({h.category}, {h.reason}): {formatT(h.fromT)} to {formatT(h.toT)}
          </li>
        ))}
        {timeline.unplacedHolds ? <li>{timeline.unplacedHolds} hold(s) cannot be placed without T-0.</li> : null}
        {timeline.redlines.map((r, i) => (
          <li key={i}>
            Out-of-limits reading at {formatT(r.t)}: {r.instruction} ({r.station}) {r.value} {r.unit}. {r.message}
          </li>
        ))}
      </ul>
    </section>
  );
}

function DatasetView({ countId, dataset, timeline, canWrite }: { countId: number; dataset: SensorDatasetDto; timeline: SensorListDto['timeline']; canWrite: boolean }) {
  const data = useSensorData(countId, dataset.id, PLOT_POINTS);
  // This view is keyed by the dataset, so the choice starts afresh for another dataset and survives a limits edit.
  const [shown, setShown] = useState<number[]>(() => dataset.channels.map((c) => c.index));

  return (
    <section aria-labelledby="sd-plot" className="flex min-w-0 flex-col gap-4">
      <h2 id="sd-plot" className="text-2xl font-bold">
        {dataset.file.name}
      </h2>
      <p className="text-sm text-ink-muted">
        {dataset.rows.toLocaleString('en-GB')} rows from {formatT(dataset.tStart)} to {formatT(dataset.tEnd)}; times {dataset.timeBase === 'wallclock' ? 'were wall-clock, converted with the count’s T-0' : 'are seconds from T-0'}.{' '}
        Uploaded by {dataset.uploadedBy?.name ?? 'someone no longer on the team'}. <a href={dataset.file.url}>Original file</a>
      </p>
      <fieldset className="min-w-0">
        <legend className="mb-1 font-bold">Channels to plot</legend>
        <div className="flex flex-wrap gap-x-4 gap-y-1">
          {dataset.channels.map((c) => {
            const look = seriesLook(c.index);
            return (
              <label key={c.index} className="flex min-h-12 items-center gap-2">
                <input
                  type="checkbox"
                  className="h-5 w-5"
                  checked={shown.includes(c.index)}
                  onChange={(e) => setShown((s) => (e.target.checked ? [...s, c.index].sort((a, b) => a - b) : s.filter((x) => x !== c.index)))}
                />
                <svg width="28" height="10" aria-hidden="true">
                  <line x1="0" y1="5" x2="28" y2="5" stroke={`var(${look.colorVar})`} strokeWidth="3" strokeDasharray={look.dash.join(' ') || undefined} />
                </svg>
                {c.name}
                {c.unit ? ` (${c.unit})` : ''}
              </label>
            );
          })}
        </div>
      </fieldset>
      {data.isPending ? <Loading label="Reading the readings…" /> : null}
      {data.isError ? (
        <Notice tone="danger" title="Could not load the readings">
          <p>{errorMessage(data.error)}</p>
        </Notice>
      ) : null}
      {data.data ? <PlotAndTable countId={countId} dataset={dataset} data={data.data} shown={shown} timeline={timeline} /> : null}
      {canWrite ? <LimitsEditor countId={countId} dataset={dataset} /> : null}
      {canWrite ? <RemoveDataset countId={countId} dataset={dataset} /> : null}
    </section>
  );
}

function PlotAndTable({
  countId,
  dataset,
  data,
  shown,
  timeline,
}: {
  countId: number;
  dataset: SensorDatasetDto;
  data: SensorDataDto;
  shown: number[];
  timeline: SensorListDto['timeline'];
}) {
  // A zoomed view of thinned data asks for that stretch in detail, a moment after the zoom or pan settles.
  const [view, setView] = useState<[number, number] | null>(null);
  const [stretch, setStretch] = useState<SensorWindow | null>(null);
  useEffect(() => {
    if (!data.decimated || view === null) return setStretch(null);
    const timer = setTimeout(() => setStretch({ from: view[0].toFixed(3), to: view[1].toFixed(3) }), 250);
    return () => clearTimeout(timer);
  }, [view, data.decimated]);
  const detail = useSensorWindow(countId, dataset.id, PLOT_POINTS, stretch);
  const columns = useMemo<PlotColumns>(() => {
    const d = stretch ? detail.data : undefined;
    if (!d?.window) return { t: data.t, values: data.values };
    return mergeDetail({ t: data.t, values: data.values }, { t: d.t, values: d.values }, d.window.from, d.window.to);
  }, [data, detail.data, stretch]);
  const full = useMemo<[number, number]>(() => [dataset.tStart, dataset.tEnd], [dataset.tStart, dataset.tEnd]);

  const series = useMemo<PlotSeries[]>(
    () =>
      shown.map((i) => {
        const c = dataset.channels[i]!;
        return { label: c.name, unit: c.unit, values: columns.values[i]!, low: c.low, high: c.high, style: i };
      }),
    [shown, dataset.channels, columns],
  );
  const names = series.map((s) => s.label).join(', ') || 'no channel';
  return (
    <>
      {data.decimated ? (
        <p className="text-sm text-ink-muted">
          The plot shows {data.points.toLocaleString('en-GB')} of {data.rows.toLocaleString('en-GB')} rows: each stretch keeps its lowest and highest reading, so no peak is lost. Zoom
          in for more detail. The table is worked out from every row.
        </p>
      ) : null}
      <SensorPlot
        t={columns.t}
        series={series}
        timeline={timeline}
        full={full}
        onView={setView}
        label={`Plot of ${names} against seconds from T-0, ${formatT(dataset.tStart)} to ${formatT(dataset.tEnd)}. The table below gives each channel’s minimum, maximum and limit crossings.`}
      />
      <SensorSummaryTable dataset={dataset} summaries={data.summaries} />
    </>
  );
}
