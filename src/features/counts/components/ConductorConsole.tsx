import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Notice } from '../../../components/ui/Notice';
import { TextAreaField } from '../../../components/ui/SelectField';
import type { Me } from '../../../contract/people';
import { HOLD_CATEGORY_LABELS } from '../../../domain/count/events';
import { countedSteps } from '../../../domain/count/plan';
import { holdTimeByCategory, projectedT0, windowWarning, type HoldTimeKey } from '../../../domain/count/projection';
import { openHolds, tAt, type CountState } from '../../../domain/count/state';
import { formatTMinus, parseTMinus, T_MINUS_HINT } from '../../../domain/procedures/tminus';
import type { CommandResult, LiveCount } from '../hooks/useLiveCount';
import { useServerNow } from '../hooks/useServerNow';
import { clockTime, spanWords } from '../lib/format';
import {
  BigClock,
  CategoryReasonForm,
  ConfirmButton,
  ConnectionBadge,
  CountLog,
  HoldBanner,
  mayClearHold,
  PollTable,
  SafetyNote,
  StationBoard,
  StatusLine,
  StepCard,
} from './CountParts';

function nextSteps(state: CountState, n: number) {
  if (!state.plan) return [];
  return countedSteps(state.plan)
    .filter((s) => state.steps[s.key]?.status === 'pending')
    .slice(0, n);
}

function PollOpener({ state, onOpen, onCancel }: { state: CountState; onOpen: (stations: string[], stepKey: string | null, question: string) => void; onCancel: () => void }) {
  const plan = state.plan!;
  const pollStep = Object.values(state.currentSteps)
    .flat()
    .map((k) => plan.steps.find((s) => s.key === k))
    .find((s) => s?.kind === 'poll');
  const all = [...new Set([...plan.crew.map((c) => c.station), ...Object.keys(state.stations)])];
  const [stations, setStations] = useState<string[]>(pollStep ? pollStep.stations : plan.crew.map((c) => c.station));
  const [question, setQuestion] = useState(pollStep?.instruction ?? '');
  const [error, setError] = useState<string | undefined>();
  return (
    <form
      aria-label="Open a poll"
      noValidate
      className="flex basis-full flex-col gap-3 rounded-md border-2 border-line bg-sunken p-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (stations.length === 0) return setError('Choose at least one station');
        onOpen(stations, pollStep?.key ?? null, question.trim());
      }}
    >
      {pollStep ? <p className="font-bold">For the poll step: {pollStep.instruction}</p> : null}
      <CheckboxGroup legend="Stations to ask" layout="wrap" options={all.map((s) => ({ value: s, label: s }))} value={stations} onChange={setStations} error={error} />
      <TextField label="Question (optional)" value={question} onChange={(e) => setQuestion(e.target.value)} maxLength={300} />
      <div className="flex gap-2">
        <Button type="submit" variant="primary">
          Open poll
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** The test conductor's screen: the clock, the holds, the poll, the stations, the controls and the log. */
export function ConductorConsole({ live, me, manned, countId }: { live: LiveCount; me: Me; manned: readonly string[]; countId: number }) {
  const { state, send } = live;
  const now = useServerNow(live.offset);
  const [problem, setProblem] = useState<string | null>(null);
  const [form, setForm] = useState<'poll' | 'hold' | 'scrub' | null>(null);
  const [recycleTo, setRecycleTo] = useState<string | null>(null);
  const [recycleReason, setRecycleReason] = useState('');
  const [startAt, setStartAt] = useState<string | null>(null);

  if (!state?.plan) return null;
  const plan = state.plan;
  const t = tAt(state, now);

  const run = async (p: Promise<CommandResult>, after?: () => void) => {
    setProblem(null);
    const r = await p;
    if (r.ok) after?.();
    else setProblem(r.error);
  };

  const current = Object.values(state.currentSteps)
    .flat()
    .map((k) => plan.steps.find((s) => s.key === k))
    .filter((s) => s !== undefined);
  const upcoming = nextSteps(state, 3);
  const projected = projectedT0(state, now);
  const late = windowWarning(state, now);
  const held = holdTimeByCategory(state, now);
  const live_ = state.status === 'counting' || state.status === 'holding';
  const mustRecycle = state.status === 'holding' && state.clock.tSeconds >= plan.terminalCountSeconds;
  const defaultRecycle = formatTMinus(Math.min(plan.recycleToSeconds, Math.floor(state.clock.tSeconds)));
  const recycleText = recycleTo ?? defaultRecycle;
  const recycleSeconds = parseTMinus(recycleText);
  const startText = startAt ?? formatTMinus(plan.startTSeconds);
  const startSeconds = parseTMinus(startText);

  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="flex flex-col gap-3">
          <BigClock t={t} />
          <StatusLine state={state} />
          <p className="text-lg">
            Projected T-0: <strong>{projected !== null ? clockTime(projected) : '—'}</strong>
            {plan.windowEnd !== null ? (
              <>
                {' '}
                · Window ends: <strong>{clockTime(plan.windowEnd)}</strong>
              </>
            ) : null}
          </p>
          {late ? (
            <Notice tone="warning" title="Past the window">
              <p>At this rate T-0 would fall {spanWords(late.lateBySeconds)} after the firing window ends.</p>
            </Notice>
          ) : null}
        </div>
        <div className="flex flex-col gap-2">
          <ConnectionBadge connection={live.connection} queued={live.queued} />
          {/* The instant is read when the link is followed: now, as the server's clock has it. */}
          <Link to={`/anomalies/new?countId=${countId}&at=${Math.round(now)}`} className="font-bold">
            Report anomaly now
          </Link>
        </div>
      </div>

      <HoldBanner state={state} canClear={(h) => mayClearHold(h, me, manned)} onClear={(h) => void run(send({ type: 'hold:clear', holdId: h.holdId }))} />
      {problem ? (
        <Notice tone="danger" title="Not done">
          <p>{problem}</p>
        </Notice>
      ) : null}
      {live.lateRefusal ? (
        <Notice tone="danger" title="Refused after reconnecting">
          <p>{live.lateRefusal}</p>
          <Button variant="quiet" onClick={live.dismissLateRefusal}>
            Dismiss
          </Button>
        </Notice>
      ) : null}

      <section aria-label="Controls" className="flex flex-wrap gap-2 rounded-md border-2 border-line bg-surface p-3">
        {state.status === 'ready' ? (
          <ConfirmButton
            label="Start the count"
            variant="primary"
            question={`Start the count at ${formatTMinus(plan.startTSeconds)}, or pick it up later (a rehearsal of the last minutes: the steps before are skipped and logged as skipped)?`}
            confirmLabel="Yes, start"
            onConfirm={() => {
              if (startSeconds === undefined) {
                setProblem(T_MINUS_HINT);
                return false;
              }
              return run(send(startSeconds === plan.startTSeconds ? { type: 'count:start' } : { type: 'count:start', fromSeconds: startSeconds }), () => setStartAt(null));
            }}
          >
            <TextField label="Start at" hint={T_MINUS_HINT} value={startText} onChange={(e) => setStartAt(e.target.value)} error={startSeconds === undefined ? T_MINUS_HINT : undefined} />
          </ConfirmButton>
        ) : null}
        {(live_ || state.status === 'safing') && !state.poll && form !== 'poll' ? <Button onClick={() => setForm('poll')}>Open a poll</Button> : null}
        {form === 'poll' ? (
          <PollOpener
            state={state}
            onCancel={() => setForm(null)}
            onOpen={(stations, stepKey, question) =>
              void run(send({ type: 'poll:open', stations, ...(stepKey ? { stepKey } : {}), ...(question ? { question } : {}) }), () => setForm(null))
            }
          />
        ) : null}
        {state.builtInHold ? (
          <ConfirmButton label="Release built-in hold early" question="End the built-in hold now and let the clock run?" confirmLabel="Yes, release" onConfirm={() => run(send({ type: 'builtInHold:release' }))} />
        ) : null}
        {live_ && form !== 'hold' ? (
          <Button variant="danger" onClick={() => setForm('hold')}>
            Call a hold
          </Button>
        ) : null}
        {state.status === 'holding' && !mustRecycle ? (
          <ConfirmButton
            label="Resume the count"
            variant="primary"
            disabled={openHolds(state).length > 0}
            question={`Resume the clock from ${formatTMinus(Math.round(state.clock.tSeconds))}?`}
            confirmLabel="Yes, resume"
            onConfirm={() => run(send({ type: 'count:resume' }))}
          />
        ) : null}
        {state.status === 'holding' ? (
          <ConfirmButton
            label="Recycle"
            question={mustRecycle ? `The count held inside terminal count: it must recycle (usually to ${formatTMinus(plan.recycleToSeconds)}).` : 'Recycle the count to an earlier time?'}
            confirmLabel="Yes, recycle"
            onConfirm={() => {
              if (recycleSeconds === undefined || !recycleReason.trim()) {
                setProblem(recycleSeconds === undefined ? T_MINUS_HINT : 'Say why the count recycles.');
                return false;
              }
              return run(send({ type: 'count:recycle', toSeconds: recycleSeconds, reason: recycleReason.trim() }), () => {
                setRecycleTo(null);
                setRecycleReason('');
              });
            }}
          >
            <TextField label="Recycle to" hint={T_MINUS_HINT} value={recycleText} onChange={(e) => setRecycleTo(e.target.value)} error={recycleSeconds === undefined ? T_MINUS_HINT : undefined} />
            <TextAreaField label="Why recycle?" rows={2} value={recycleReason} onChange={(e) => setRecycleReason(e.target.value)} />
          </ConfirmButton>
        ) : null}
        {live_ && state.t0At !== null ? (
          <ConfirmButton label="Firing complete" question="Declare the firing complete and move to safing?" confirmLabel="Yes, firing complete" onConfirm={() => run(send({ type: 'count:complete' }))} />
        ) : null}
        {state.status === 'safing' ? (
          <ConfirmButton label="Close safing" question="Are all safing steps done and the stand safe?" confirmLabel="Yes, close safing" onConfirm={() => run(send({ type: 'count:close-safing' }))} />
        ) : null}
        {state.status !== 'safing' && state.status !== 'scrubbed' && state.status !== 'complete' && form !== 'scrub' ? (
          <Button variant="danger" onClick={() => setForm('scrub')}>
            Scrub…
          </Button>
        ) : null}
        {form === 'hold' ? (
          <div className="basis-full">
            <CategoryReasonForm title="Call a hold" submitLabel="Call HOLD" onCancel={() => setForm(null)} onSubmit={({ category, reason }) => void run(send({ type: 'hold:call', category, reason }), () => setForm(null))} />
          </div>
        ) : null}
        {form === 'scrub' ? (
          <div className="basis-full">
            <CategoryReasonForm
              title="Scrub the count (no firing; safing follows)"
              submitLabel="Scrub the count"
              onCancel={() => setForm(null)}
              onSubmit={({ category, reason }) => void run(send({ type: 'count:scrub', category, reason }), () => setForm(null))}
            />
          </div>
        ) : null}
      </section>

      {state.poll ? <PollTable poll={state.poll} now={now} /> : null}

      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-label="Current steps" className="flex flex-col gap-2">
          <h2 className="text-xl font-bold">Now</h2>
          {current.length === 0 ? <p className="text-ink-muted">No step is due.</p> : null}
          {current.map((s) => (
            <StepCard key={s.key} step={s} stepState={state.steps[s.key]} plan={plan} />
          ))}
        </section>
        <section aria-label="Next steps" className="flex flex-col gap-2">
          <h2 className="text-xl font-bold">Next</h2>
          {upcoming.length === 0 ? <p className="text-ink-muted">No more counted steps.</p> : null}
          {upcoming.map((s) => (
            <StepCard key={s.key} step={s} stepState={state.steps[s.key]} plan={plan} />
          ))}
        </section>
      </div>

      <div className="grid gap-4 lg:grid-cols-2">
        <StationBoard state={state} />
        <section aria-label="Hold time" className="rounded-md border-2 border-line bg-surface p-3">
          <h2 className="mb-2 text-xl font-bold">Time on hold</h2>
          {Object.keys(held).length === 0 ? <p className="text-ink-muted">No holds yet.</p> : null}
          <ul>
            {(Object.entries(held) as [HoldTimeKey, number][]).map(([k, s]) => (
              <li key={k}>
                {k === 'built-in' ? 'Built-in holds' : HOLD_CATEGORY_LABELS[k]}: <strong>{spanWords(s)}</strong>
              </li>
            ))}
          </ul>
        </section>
      </div>

      <CountLog log={live.log} plan={plan} />
      <SafetyNote />
    </div>
  );
}
