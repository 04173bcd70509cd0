import { useState, type FormEvent } from 'react';
import type { SensorDatasetDto } from '../../../contract/sensors';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { errorMessage, isApiError } from '../../../lib/api';
import { useDeleteSensorData } from '../api/deleteSensorData';
import { useUpdateSensorLimits } from '../api/updateSensorLimits';
import { useUploadSensorData } from '../api/uploadSensorData';

function ErrorNotice({ error }: { error: unknown }) {
  return (
    <Notice tone="danger" title="Not saved">
      <p>{errorMessage(error)}</p>
      {isApiError(error) && error.details.length > 1 ? (
        <ul className="list-disc pl-6">
          {error.details.map((d, i) => (
            <li key={i}>{d.message}</li>
          ))}
        </ul>
      ) : null}
    </Notice>
  );
}

const TIME_HEADER = /^(t|time|t_s|time_s|t_sec|time_sec|timestamp|datetime|date_time|utc|time_utc|elapsed)$/i;

/**
 * The channel names in a CSV's header, read in the browser only to offer limit fields before the upload; the server
 * reads the file again and is the one that decides.
 */
export async function channelNamesOf(file: File): Promise<string[]> {
  const head = await file.slice(0, 64 * 1024).text();
  const line = head
    .replace(/^\uFEFF/, '')
    .split(/\r?\n/)
    .find((l) => l.trim() !== '' && !l.startsWith('#'));
  if (!line) return [];
  return line
    .split(',')
    .map((cell) => cell.trim().replace(/^"|"$/g, '').replace(/\s*[([][^)\]]*[)\]]\s*$/, '').trim())
    .filter((name) => name !== '' && !TIME_HEADER.test(name.replace(/[\s-]+/g, '_')))
    .slice(0, 16);
}

type LimitsDraft = Record<string, { low: string; high: string }>;

/** Adds a CSV of readings to the count, with optional limits per channel. The server reads every row before it stores anything. */
export function UploadSensorForm({ countId, hasT0, onUploaded }: { countId: number; hasT0: boolean; onUploaded: (d: SensorDatasetDto) => void }) {
  const upload = useUploadSensorData();
  const [file, setFile] = useState<File | null>(null);
  const [missing, setMissing] = useState(false);
  const [channels, setChannels] = useState<string[]>([]);
  const [limits, setLimits] = useState<LimitsDraft>({});
  const [problem, setProblem] = useState<string | null>(null);

  async function choose(next: File | null) {
    setFile(next);
    setMissing(false);
    setLimits({});
    setChannels(next ? await channelNamesOf(next).catch(() => []) : []);
  }
  function submit(e: FormEvent) {
    e.preventDefault();
    if (!file) return setMissing(true);
    const out: Record<string, { low?: number; high?: number }> = {};
    for (const name of channels) {
      const d = limits[name];
      if (!d) continue;
      const entry: { low?: number; high?: number } = {};
      for (const side of ['low', 'high'] as const) {
        if (d[side].trim() === '') continue;
        const value = Number(d[side]);
        if (!Number.isFinite(value)) return setProblem(`Enter the ${side} limit of ${name} as a number, or leave it empty.`);
        entry[side] = value;
      }
      if (entry.low !== undefined || entry.high !== undefined) out[name] = entry;
    }
    setProblem(null);
    const form = e.target as HTMLFormElement;
    upload.mutate({ countId, file, limits: out }, { onSuccess: (d) => (onUploaded(d), form.reset(), void choose(null)) });
  }
  return (
    <section aria-labelledby="sd-upload" className="flex flex-col gap-3">
      <h2 id="sd-upload" className="text-2xl font-bold">
        Add test data
      </h2>
      <p className="max-w-prose">
        A CSV file with a header row: a time column and up to 16 channels of numbers. Name the time column <code>t_s</code> for seconds from T-0
        {hasT0 ? <>, or <code>timestamp</code> for date-times with a zone (they are converted with this count’s T-0)</> : <> (this count never reached T-0, so wall-clock times cannot be used)</>}. A unit may follow a channel’s name in brackets, like{' '}
        <code>chamber_pressure (bar)</code>. Limits, in each channel’s unit, can be set here or later.
      </p>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
        <div className="flex flex-col gap-1">
          <label htmlFor="sd-file" className="font-bold">
            CSV file
          </label>
          <input
            id="sd-file"
            type="file"
            accept=".csv,text/csv"
            aria-invalid={missing ? true : undefined}
            aria-describedby={missing ? 'sd-file-error' : undefined}
            onChange={(e) => void choose(e.target.files?.[0] ?? null)}
            className="min-w-0 max-w-full"
          />
          {missing ? (
            <p id="sd-file-error" className="font-bold text-danger">
              Choose a CSV file first.
            </p>
          ) : null}
        </div>
        {channels.map((name) => (
          <fieldset key={name} className="flex min-w-0 flex-wrap items-end gap-3">
            <legend className="mb-1 font-bold">Limits for {name} (optional)</legend>
            {(['low', 'high'] as const).map((side) => (
              <label key={side} className="flex flex-col gap-1">
                {side === 'low' ? 'Low limit' : 'High limit'}
                <input
                  inputMode="decimal"
                  className="min-h-12 w-32 rounded-md border-2 border-line bg-surface px-3 text-ink"
                  value={limits[name]?.[side] ?? ''}
                  onChange={(e) => setLimits((l) => ({ ...l, [name]: { ...(l[name] ?? { low: '', high: '' }), [side]: e.target.value } }))}
                />
              </label>
            ))}
          </fieldset>
        ))}
        <div>
          <Button type="submit" variant="primary" pending={upload.isPending} pendingLabel="Reading the file…">
            Upload test data
          </Button>
        </div>
        {problem ? (
          <Notice tone="danger" title="Not sent">
            <p>{problem}</p>
          </Notice>
        ) : null}
        {upload.isError ? <ErrorNotice error={upload.error} /> : null}
        {upload.isSuccess ? (
          <Notice tone="success" title="Added">
            <p>
              {upload.data.file.name}: {upload.data.rows.toLocaleString('en-GB')} rows, {upload.data.channels.length} channels.
            </p>
          </Notice>
        ) : null}
      </form>
    </section>
  );
}

type Draft = Record<number, { low: string; high: string }>;
const asText = (v: number | null) => (v === null ? '' : String(v));

/** Low and high limit lines per channel, in the channel's unit; empty means no limit. */
export function LimitsEditor({ countId, dataset }: { countId: number; dataset: SensorDatasetDto }) {
  const update = useUpdateSensorLimits();
  const [draft, setDraft] = useState<Draft>(() => Object.fromEntries(dataset.channels.map((c) => [c.index, { low: asText(c.low), high: asText(c.high) }])));
  const [problem, setProblem] = useState<string | null>(null);
  function submit(e: FormEvent) {
    e.preventDefault();
    const channels = [];
    for (const c of dataset.channels) {
      const d = draft[c.index]!;
      const num = (s: string) => (s.trim() === '' ? null : Number(s));
      const low = num(d.low);
      const high = num(d.high);
      if ((low !== null && !Number.isFinite(low)) || (high !== null && !Number.isFinite(high))) return setProblem(`Enter the limits of ${c.name} as numbers, or leave them empty.`);
      channels.push({ index: c.index, low, high });
    }
    setProblem(null);
    update.mutate({ countId, datasetId: dataset.id, patch: { channels } });
  }
  return (
    <details className="rounded-md border-2 border-line p-3">
      <summary className="cursor-pointer font-bold">Edit limits</summary>
      <form onSubmit={submit} className="mt-3 flex flex-col gap-3" noValidate>
        {dataset.channels.map((c) => (
          <fieldset key={c.index} className="flex min-w-0 flex-wrap items-end gap-3">
            <legend className="mb-1 font-bold">
              {c.name}
              {c.unit ? ` (${c.unit})` : ''}
            </legend>
            {(['low', 'high'] as const).map((side) => (
              <label key={side} className="flex flex-col gap-1">
                {side === 'low' ? 'Low limit' : 'High limit'}
                <input
                  inputMode="decimal"
                  className="min-h-12 w-32 rounded-md border-2 border-line bg-surface px-3 text-ink"
                  value={draft[c.index]![side]}
                  onChange={(e) => setDraft((d) => ({ ...d, [c.index]: { ...d[c.index]!, [side]: e.target.value } }))}
                />
              </label>
            ))}
          </fieldset>
        ))}
        <div>
          <Button type="submit" variant="primary" pending={update.isPending} pendingLabel="Saving…">
            Save limits
          </Button>
        </div>
        {problem ? (
          <Notice tone="danger" title="Not saved">
            <p>{problem}</p>
          </Notice>
        ) : null}
        {update.isError ? <ErrorNotice error={update.error} /> : null}
        {update.isSuccess ? <Notice tone="success" title="Limits saved" /> : null}
      </form>
    </details>
  );
}

/** Removes the dataset and its file after a second press; the count's log is not touched. */
export function RemoveDataset({ countId, dataset }: { countId: number; dataset: SensorDatasetDto }) {
  const remove = useDeleteSensorData();
  const [asked, setAsked] = useState(false);
  return (
    <div className="flex flex-col gap-2">
      {asked ? (
        <div className="flex flex-wrap items-center gap-2">
          <p>Remove {dataset.file.name} and its readings? The count log stays as it is.</p>
          <Button variant="danger" pending={remove.isPending} onClick={() => remove.mutate({ countId, datasetId: dataset.id })}>
            Yes, remove the dataset
          </Button>
          <Button onClick={() => setAsked(false)}>Keep it</Button>
        </div>
      ) : (
        <div>
          <Button variant="quiet" onClick={() => setAsked(true)}>
            Remove this dataset
          </Button>
        </div>
      )}
      {remove.isError ? <ErrorNotice error={remove.error} /> : null}
    </div>
  );
}
