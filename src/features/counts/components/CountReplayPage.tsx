import { useQuery } from '@tanstack/react-query';
import { format } from 'date-fns';
import { useEffect, useMemo, useState, type FormEvent } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import type { CountEventDto } from '../../../contract/count';
import { HOLD_CATEGORY_LABELS, type CountEvent } from '../../../domain/count/events';
import { replayIndex } from '../../../domain/count/reduce';
import { tAt } from '../../../domain/count/state';
import { instantsAtT } from '../../../domain/count/timeline';
import { formatTMinus, parseTMinus, T_MINUS_HINT } from '../../../domain/procedures/tminus';
import { api, errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { countKeys } from '../api/keys';
import { useCountAnomalies } from '../api/listCountAnomalies';
import { logT, type LogEntry } from '../hooks/useLiveCount';
import { RecordCheck } from './RecordCheck';
import { BigClock, CountLog, HoldBanner, PollTable, StationBoard, StatusLine, StepCard } from './CountParts';

const SPEEDS = [1, 10, 60] as const;
const TICK_MS = 250;

type Mark = { kind: 'hold' | 'poll' | 'redline' | 'recycle' | 'scrub' | 'anomaly'; at: number };

function marksOf(events: readonly CountEvent[]): Mark[] {
  const out: Mark[] = [];
  for (const e of events) {
    if (e.type === 'hold:called') out.push({ kind: 'hold', at: e.at });
    else if (e.type === 'poll:opened') out.push({ kind: 'poll', at: e.at });
    else if (e.type === 'reading:recorded' && !e.payload.inLimits) out.push({ kind: 'redline', at: e.at });
    else if (e.type === 'count:recycled') out.push({ kind: 'recycle', at: e.at });
    else if (e.type === 'count:scrubbed') out.push({ kind: 'scrub', at: e.at });
  }
  return out;
}

/**
 * Replay: the count at any instant of its log, folded by the same reducer that ran it live (`replayIndex`: the
 * answers of `stateAt`, from states kept along the log). A scrubber, play at 1x, 10x and 60x, jumps to the next hold,
 * poll or redline, and a link to the instant shown.
 */
export function CountReplayPage() {
  const { id } = useParams();
  const countId = Number(id);
  const events = useQuery({
    queryKey: [...countKeys.detail(countId), 'events'],
    queryFn: ({ signal }) => api.get<CountEventDto[]>(`/api/counts/${countId}/events`, { signal }),
  });
  if (events.isPending) return <Loading label="Reading the count log…" />;
  if (events.isError)
    return (
      <Page title="Replay">
        <Notice tone="danger" title="Could not read the count log">
          <p>{errorMessage(events.error)}</p>
        </Notice>
      </Page>
    );
  if (events.data.length === 0) return <Page title="Replay">This count has no events.</Page>;
  return <Replay countId={countId} events={events.data as unknown as CountEvent[]} />;
}

// Who may report an anomaly (the server's rule, server/routes/anomalies.routes.ts); others only read them.
const REPORTERS = ['conductor', 'safety', 'admin', 'operator'] as const;

function Replay({ countId, events }: { countId: number; events: CountEvent[] }) {
  const me = useSignedInMe();
  const mayReport = me.roles.some((r) => (REPORTERS as readonly string[]).includes(r));
  const [params, setParams] = useSearchParams();
  const first = events[0]!.at;
  const last = events.at(-1)!.at;
  const asked = Number(params.get('at'));
  const [at, setAt] = useState(() => (Number.isFinite(asked) && asked >= first && asked <= last ? asked : last));
  const [playing, setPlaying] = useState(false);
  const [speed, setSpeed] = useState<(typeof SPEEDS)[number]>(10);
  const [tText, setTText] = useState('');
  const [tFound, setTFound] = useState<{ t: number; instants: number[]; index: number } | { error: string } | null>(null);

  // One fold of the log: every event with the count time it happened at, and the states kept for scrubbing (the
  // state at instant after instant, each folded from the kept state before it).
  const { entries, index } = useMemo(() => {
    const list: LogEntry[] = [];
    const built = replayIndex(events, undefined, (e, before, after) => list.push({ event: e, t: logT(before, after, e) }));
    return { entries: list, index: built };
  }, [events]);
  const anomalies = useCountAnomalies(countId);
  const reported = useMemo(() => (anomalies.data ?? []).filter((a) => a.atMs >= first && a.atMs <= last), [anomalies.data, first, last]);
  const marks = useMemo(
    () => [...marksOf(events), ...reported.map((a): Mark => ({ kind: 'anomaly', at: a.atMs }))].sort((a, b) => a.at - b.at),
    [events, reported],
  );
  // Every hold of the whole count, shaded on the timeline.
  const allHolds = index.final.holds;
  const state = useMemo(() => index.stateAt(at), [index, at]);
  const t = tAt(state, at);

  useEffect(() => {
    if (!playing) return;
    const timer = setInterval(() => {
      setAt((cur) => {
        const next = Math.min(last, cur + TICK_MS * speed);
        if (next >= last) setPlaying(false);
        return next;
      });
    }, TICK_MS);
    return () => clearInterval(timer);
  }, [playing, speed, last]);

  // The address names the instant shown (when still), so it can be sent to someone.
  useEffect(() => {
    if (playing) return;
    const rounded = String(Math.round(at));
    if (params.get('at') !== rounded) setParams((p) => ({ ...Object.fromEntries(p), at: rounded }), { replace: true });
  }, [at, playing, params, setParams]);

  const jump = (kind: Mark['kind'], direction: 1 | -1) => {
    const list = marks.filter((m) => m.kind === kind);
    const target = direction === 1 ? list.find((m) => m.at > at) : [...list].reverse().find((m) => m.at < at);
    if (target) {
      setPlaying(false);
      setAt(target.at);
    }
  };
  const goToT = (e: FormEvent) => {
    e.preventDefault();
    const wanted = parseTMinus(tText);
    if (wanted === undefined) return setTFound({ error: T_MINUS_HINT });
    const instants = instantsAtT(events, wanted);
    if (instants.length === 0) return setTFound({ error: `The clock never read ${formatTMinus(wanted)} in this log.` });
    setPlaying(false);
    setAt(instants[0]!);
    setTFound({ t: wanted, instants, index: 0 });
  };
  const nextTime = () => {
    if (!tFound || 'error' in tFound) return;
    const index = (tFound.index + 1) % tFound.instants.length;
    setPlaying(false);
    setAt(tFound.instants[index]!);
    setTFound({ ...tFound, index });
  };
  const plan = state.plan;
  const current = plan
    ? Object.values(state.currentSteps)
        .flat()
        .map((k) => plan.steps.find((s) => s.key === k))
        .filter((s) => s !== undefined)
    : [];
  const span = Math.max(1, last - first);
  /** Where an instant lies along the timeline, 0 to 100. */
  const pct = (ms: number) => Math.min(100, Math.max(0, ((ms - first) / span) * 100));

  return (
    <Page
      title={`Replay: ${plan?.name ?? `count ${countId}`}`}
      kicker="Replay from the count log"
      actions={
        <>
          <Link to={`/counts/${countId}/report`}>Count report</Link>
          <Link to={`/counts/${countId}/data`}>Sensor data</Link>
          {mayReport ? <Link to={`/anomalies/new?countId=${countId}&at=${Math.round(at)}`}>Report anomaly at this instant</Link> : null}
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <section aria-label="Instant" className="flex flex-col gap-2 rounded-md border-2 border-line bg-surface p-3">
          <p className="text-lg font-bold">
            {format(at, 'yyyy-MM-dd HH:mm:ss')} <span className="text-ink-muted">(server time)</span>
          </p>
          <div aria-hidden="true" className="relative h-5 w-full rounded bg-sunken">
            {allHolds.map((h) => (
              <span
                key={h.holdId}
                className="absolute top-0 h-5 overflow-hidden border-x-2 border-danger bg-danger-wash text-center text-xs leading-5 font-bold text-danger"
                style={{ left: `${pct(h.calledAt)}%`, width: `${Math.max(0.5, pct(h.endedAt ?? last) - pct(h.calledAt))}%`, maxWidth: `${100 - pct(h.calledAt)}%` }}
                title={`${h.holdId}: ${HOLD_CATEGORY_LABELS[h.category]}`}
              >
                {HOLD_CATEGORY_LABELS[h.category].charAt(0)}
              </span>
            ))}
            {reported.map((a) => (
              <span key={`a${a.id}`} className="absolute top-1 h-3 w-3 rotate-45 border-2 border-ink bg-caution" style={{ left: `calc(${pct(a.atMs)}% - 0.375rem)` }} title={a.ref} />
            ))}
            <span className="absolute top-[-4px] h-7 w-1 bg-ink" style={{ left: `min(${pct(at)}%, 100% - 0.25rem)` }} />
          </div>
          {allHolds.length > 0 ? (
            <ul aria-label="Holds on the timeline" className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
              {allHolds.map((h) => (
                <li key={h.holdId}>
                  <button
                    type="button"
                    className="min-h-8 underline"
                    onClick={() => {
                      setPlaying(false);
                      setAt(h.calledAt);
                    }}
                  >
                    {h.holdId} {HOLD_CATEGORY_LABELS[h.category]} at {format(h.calledAt, 'HH:mm:ss')}
                  </button>
                </li>
              ))}
            </ul>
          ) : null}
          <label className="flex flex-col gap-1 font-bold">
            Instant shown
            <input
              type="range"
              min={first}
              max={last}
              step={1000}
              value={at}
              aria-valuetext={`${format(at, 'HH:mm:ss')}`}
              onChange={(e) => {
                setPlaying(false);
                setAt(Number(e.target.value));
              }}
              className="min-h-11 w-full"
            />
          </label>
          <div className="flex flex-wrap items-center gap-2">
            <Button variant="primary" onClick={() => (playing ? setPlaying(false) : (setAt((cur) => (cur >= last ? first : cur)), setPlaying(true)))}>
              {playing ? 'Pause' : 'Play'}
            </Button>
            <label className="flex items-center gap-2 font-bold">
              Speed
              <select className="min-h-11 rounded border-2 border-line bg-surface px-2" value={speed} onChange={(e) => setSpeed(Number(e.target.value) as (typeof SPEEDS)[number])}>
                {SPEEDS.map((s) => (
                  <option key={s} value={s}>
                    {s}x
                  </option>
                ))}
              </select>
            </label>
            <Button onClick={() => jump('hold', -1)}>Previous hold</Button>
            <Button onClick={() => jump('hold', 1)}>Next hold</Button>
            <Button onClick={() => jump('poll', 1)}>Next poll</Button>
            <Button onClick={() => jump('redline', 1)}>Next redline</Button>
            <Button onClick={() => jump('recycle', 1)}>Next recycle</Button>
            <Button onClick={() => jump('anomaly', 1)} disabled={reported.length === 0}>
              Next anomaly
            </Button>
          </div>
          <form onSubmit={goToT} className="flex flex-wrap items-end gap-2">
            <TextField
              label="Go to a count time"
              hint="The instant the clock read it, e.g. T-4:12"
              value={tText}
              onChange={(e) => setTText(e.target.value)}
              error={tFound && 'error' in tFound ? tFound.error : undefined}
            />
            <Button type="submit">Go</Button>
          </form>
          {tFound && !('error' in tFound) ? (
            <p role="status" className="flex flex-wrap items-center gap-2">
              {tFound.instants.length === 1
                ? `The clock read ${formatTMinus(tFound.t)} once, at ${format(tFound.instants[0]!, 'HH:mm:ss')}.`
                : `The clock read ${formatTMinus(tFound.t)} ${tFound.instants.length} times (holds or recycles); showing time ${tFound.index + 1}, at ${format(tFound.instants[tFound.index]!, 'HH:mm:ss')}.`}
              {tFound.instants.length > 1 ? <Button onClick={nextTime}>Next time it read {formatTMinus(tFound.t)}</Button> : null}
            </p>
          ) : null}
        </section>
        <BigClock t={t} />
        <StatusLine state={state} />
        <HoldBanner state={state} />
        {reported.some((a) => Math.abs(a.atMs - at) < 1000) ? (
          <section aria-label="Anomaly at this instant" className="rounded-md border-2 border-line bg-surface p-3">
            <h2 className="text-xl font-bold">Anomaly reported at this instant</h2>
            <ul className="mt-1 flex flex-col gap-1">
              {reported
                .filter((a) => Math.abs(a.atMs - at) < 1000)
                .map((a) => (
                  <li key={a.id}>
                    <Link className="font-bold underline" to={`/anomalies/${a.id}`}>
                      {a.ref}: {a.title}
                    </Link>{' '}
                    ({a.severityLabel}, {a.status})
                  </li>
                ))}
            </ul>
          </section>
        ) : null}
        {state.poll ? (
          <PollTable poll={state.poll} now={at} />
        ) : state.polls.length > 0 ? (
          <section aria-label="Last poll" className="flex flex-col gap-2">
            <h2 className="text-xl font-bold">Last poll before this instant</h2>
            <PollTable poll={state.polls[state.polls.length - 1]!} now={at} />
          </section>
        ) : null}
        <StationBoard state={state} />
        <section aria-label="Steps at this instant" className="flex flex-col gap-2">
          <h2 className="text-xl font-bold">Steps due at this instant</h2>
          {current.length === 0 ? <p className="text-ink-muted">No step was due.</p> : null}
          {current.map((s) => (
            <StepCard key={s.key} step={s} stepState={state.steps[s.key]} plan={plan} />
          ))}
        </section>
        <CountLog log={entries.filter((e) => e.event.at <= at)} plan={plan} />
        <RecordCheck countId={countId} />
      </div>
    </Page>
  );
}
