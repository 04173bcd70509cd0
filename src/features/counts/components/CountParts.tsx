import { useId, useState, type ReactNode } from 'react';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { CautionBoxes } from '../../../components/ui/CautionBoxes';
import { TextField } from '../../../components/ui/Field';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';
import { HOLD_CATEGORIES, HOLD_CATEGORY_LABELS, type HoldCategory, type PlanStep } from '../../../domain/count/events';
import { reachTimes } from '../../../domain/count/plan';
import type { ClosedPoll, CountState, HoldRecord, OpenPoll, StepState } from '../../../domain/count/state';
import { STEP_KIND_LABELS } from '../../../domain/procedures/steps';
import type { Connection, LogEntry, QueuedCommand } from '../hooks/useLiveCount';
import { clockTime, eventWords, formatCountClock, STATUS_LOOK } from '../lib/format';

/**
 * Said once per screen, quietly: who governs the test. The footer of every page already says Holdfire is a
 * planning and record aid, not a safety authority; this adds what governs during a count.
 */
export function SafetyNote() {
  return (
    <p className="mt-6 border-t-2 border-line-soft pt-3 text-sm text-ink-muted">
      During a count the range safety officer’s and the test conductor’s calls on the radio govern; this screen shows and records
      the count, it does not make it safe.
    </p>
  );
}

/** The count time in the biggest type on the screen. A timer role: screen readers read it on request, not every tick. */
export function BigClock({ t, size = 'huge' }: { t: number; size?: 'huge' | 'large' }) {
  const text = formatCountClock(t);
  return (
    <p
      role="timer"
      aria-label={`Count time ${text}`}
      className={`whitespace-nowrap font-mono font-bold leading-none tracking-tight text-ink tabular-nums ${size === 'huge' ? 'text-[clamp(2.25rem,14vw,3.75rem)] sm:text-7xl xl:text-8xl' : 'text-[clamp(2rem,12vw,3rem)] sm:text-6xl'}`}
    >
      {text}
    </p>
  );
}

export function StatusLine({ state }: { state: CountState }) {
  const look = STATUS_LOOK[state.status];
  return (
    <p className="flex flex-wrap items-center gap-2 text-xl font-bold">
      <Badge tone={look.tone} glyph={look.glyph}>
        {look.word.toUpperCase()}
      </Badge>
      <span className="text-base font-normal text-ink-muted">{look.meaning}</span>
      {state.builtInHold ? (
        <Badge tone="caution" glyph="clock">
          BUILT-IN HOLD
        </Badge>
      ) : null}
    </p>
  );
}

export function ConnectionBadge({ connection, queued }: { connection: Connection; queued: readonly QueuedCommand[] }) {
  const waiting = queued.filter((q) => !q.sent).length;
  const look = {
    connected: { tone: 'go' as const, glyph: 'circle' as const, word: 'Connected' },
    connecting: { tone: 'neutral' as const, glyph: 'clock' as const, word: 'Connecting…' },
    reconnecting: { tone: 'caution' as const, glyph: 'triangle' as const, word: 'Reconnecting…' },
    offline: { tone: 'danger' as const, glyph: 'cross' as const, word: 'Offline' },
  }[connection];
  return (
    <div className="flex flex-col gap-2" role="status">
      <p>
        <Badge tone={look.tone} glyph={look.glyph}>
          {look.word}
        </Badge>
        {waiting > 0 ? (
          <span className="ml-2 font-bold">
            {waiting} command{waiting === 1 ? '' : 's'} waiting to send
          </span>
        ) : null}
      </p>
      {connection === 'offline' || connection === 'reconnecting' ? (
        <Notice tone="warning" title={connection === 'offline' ? 'No connection' : 'Connection lost: reconnecting'}>
          <p>
            The clock shown may be out of date. What you do now is kept and sent, in order, as soon as the connection is back. Use the
            radio for anything urgent.
          </p>
        </Notice>
      ) : null}
    </div>
  );
}

function holdCaller(h: HoldRecord): string {
  if (h.source === 'redline') return `a redline at ${h.calledByStation ?? 'a station'}`;
  if (h.source === 'poll') return 'a failed go/no-go poll';
  if (h.source === 'restart') return 'the control server';
  const who = h.calledBy?.name ?? 'someone';
  return h.calledByStation ? `${h.calledByStation} (${who})` : who;
}

/** Who may clear a hold, as the count's own rules say; the server checks again. */
export function mayClearHold(h: HoldRecord, me: { id: number; roles: readonly string[] }, manned: readonly string[]): boolean {
  const safety = me.roles.includes('safety');
  if (h.source !== 'person') return safety || me.roles.includes('conductor');
  if (h.calledByStation !== null) return safety || manned.includes(h.calledByStation);
  return safety || h.calledBy?.userId === me.id;
}

/** Every hold still open, loud; each with a clear button for whoever may clear it. */
export function HoldBanner({
  state,
  canClear,
  onClear,
}: {
  state: CountState;
  canClear?: (h: HoldRecord) => boolean;
  onClear?: (h: HoldRecord) => void;
}) {
  if (state.status !== 'holding') return null;
  const period = state.holds.filter((h) => h.endedAt === null);
  return (
    <section aria-label="Hold" className="rounded-md border-[3px] border-l-[12px] border-danger bg-danger-wash p-3 text-danger">
      <p className="flex items-center gap-2 text-2xl font-bold">
        <Glyph shape="diamond" className="size-7" /> HOLD
      </p>
      <ul className="mt-2 flex flex-col gap-3">
        {period.map((h) => (
          <li key={h.holdId} className="text-ink">
            <p className="text-lg font-bold">
              {HOLD_CATEGORY_LABELS[h.category]}: {h.reason}
            </p>
            <p className="text-sm">
              {h.holdId} called by {holdCaller(h)} at {clockTime(h.calledAt)}, {formatCountClock(h.calledAtT)}
              {h.cleared ? ` — cleared${h.clearedBy ? ` by ${h.clearedBy.name}` : ''}` : ' — open'}
            </p>
            {!h.cleared && onClear && canClear?.(h) ? (
              <Button className="mt-2" onClick={() => onClear(h)}>
                Clear hold {h.holdId}
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
      {period.length > 0 && period.every((h) => h.cleared) ? <p className="mt-2 font-bold text-ink">All holds cleared: the conductor may resume.</p> : null}
    </section>
  );
}

/** The open poll: each station's answer and how long it took. */
/** Each station of the crew: who mans it, whether its link is up, its last poll answer. */
export function StationBoard({ state }: { state: CountState }) {
  const crew = state.plan?.crew ?? [];
  return (
    <section aria-label="Stations" className="rounded-md border-2 border-line bg-surface p-3">
      <h2 className="mb-2 text-xl font-bold">Stations</h2>
      {crew.length === 0 ? <p className="text-ink-muted">No crew on this count.</p> : null}
      <div role="region" aria-label="Station table" tabIndex={0} className="overflow-x-auto">
      <table className="w-full text-left text-sm sm:text-base [&_td]:pr-1 [&_th]:pr-1">
        <thead>
          <tr>
            <th>Station</th>
            <th>Who</th>
            <th>Link</th>
            <th>Last answer</th>
          </tr>
        </thead>
        <tbody>
          {crew.map((c) => {
            const p = state.stations[c.station];
            const presence = p?.presence ?? 'unknown';
            return (
              <tr key={c.station} className="border-t border-line-soft">
                <td className="py-1 font-bold">{c.station}</td>
                <td className="py-1">{c.names.join(', ') || '—'}</td>
                <td className="py-1">
                  <Badge tone={presence === 'connected' ? 'go' : presence === 'lost' ? 'danger' : 'neutral'} glyph={presence === 'connected' ? 'circle' : presence === 'lost' ? 'cross' : 'dash'}>
                    {presence === 'connected' ? 'connected' : presence === 'lost' ? 'LOST' : 'not seen yet'}
                  </Badge>
                </td>
                <td className="py-1">{p?.lastAnswer ? `${p.lastAnswer.answer === 'go' ? 'GO' : 'NO-GO'} (${p.lastAnswer.pollId}, ${clockTime(p.lastAnswer.at)})` : '—'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
    </section>
  );
}

/** A poll's answers: an open one with its time left, or (in the replay) the last one closed, with its result. */
export function PollTable({ poll, now }: { poll: OpenPoll | ClosedPoll; now: number }) {
  const left = Math.max(0, Math.ceil((poll.openedAt + poll.timeoutSeconds * 1000 - now) / 1000));
  const closed = 'result' in poll ? poll : null;
  return (
    <section aria-label={`Poll ${poll.pollId}`} className="rounded-md border-2 border-line bg-surface p-3">
      <p className="text-lg font-bold">
        Poll {poll.pollId}: {poll.question}
      </p>
      {closed ? (
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <Badge tone={closed.result === 'go' ? 'go' : closed.result === 'nogo' ? 'danger' : 'neutral'} glyph={closed.result === 'go' ? 'check' : closed.result === 'nogo' ? 'cross' : 'dash'}>
            {closed.result === 'go' ? 'Passed' : closed.result === 'nogo' ? 'Failed' : 'Cancelled'}
          </Badge>
          <span>closed at {clockTime(closed.closedAt)}</span>
        </p>
      ) : (
        <p className="text-sm text-ink-muted">{left} s left to answer</p>
      )}
      <table className="mt-2 w-full text-left">
        <thead>
          <tr>
            <th className="py-1">Station</th>
            <th className="py-1">Answer</th>
            <th className="py-1">Time to answer</th>
          </tr>
        </thead>
        <tbody>
          {poll.stations.map((s) => {
            const a = poll.answers[s];
            return (
              <tr key={s} className="border-t border-line-soft">
                <td className="py-1 font-bold">{s}</td>
                <td className="py-1">
                  {a ? (
                    <Badge tone={a.answer === 'go' ? 'go' : 'danger'} glyph={a.answer === 'go' ? 'check' : 'cross'}>
                      {a.answer === 'go' ? 'GO' : `NO-GO: ${a.reason}`}
                    </Badge>
                  ) : (
                    <Badge glyph="clock">{closed ? (closed.lost.includes(s) ? 'lost' : 'no answer') : 'waiting'}</Badge>
                  )}
                </td>
                <td className="py-1 tabular-nums">{a ? `${(a.responseMs / 1000).toFixed(1)} s` : '—'}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </section>
  );
}

/** A step with its station, time, cautions and PPE; `children` holds what the viewer can do with it. */
export function StepCard({ step, stepState, plan, label, children }: { step: PlanStep; stepState?: StepState; plan: CountState['plan']; label?: string; children?: ReactNode }) {
  const at = plan ? reachTimes(plan).get(step.key) : undefined;
  return (
    <article aria-label={label ?? `Step: ${step.instruction}`} className="rounded-md border-2 border-line bg-surface p-3">
      <p className="text-sm font-bold uppercase tracking-wide text-ink-muted">
        {step.station} · {STEP_KIND_LABELS[step.kind]} · {step.tSeconds !== null ? formatCountClock(step.tSeconds) : at !== undefined ? `untimed (after ${formatCountClock(at)})` : 'safing'}
        {stepState?.status === 'done' ? (stepState.skipped ? ' · skipped' : ' · done') : ''}
      </p>
      <p className="my-1 text-xl font-bold">{step.instruction}</p>
      {step.kind === 'reading' ? (
        <p>
          Limits: {step.min ?? '—'} to {step.max ?? '—'} {step.unit}
        </p>
      ) : null}
      <div className="mt-2">
        <CautionBoxes items={step.cautions.map((c) => ({ level: c.kind, text: c.text, from: c.source || null }))} label={`Cautions for ${step.key}`} compact />
      </div>
      {step.ppe.length ? (
        <p className="mt-2">
          <span className="font-bold">PPE:</span> {step.ppe.join(', ')}
        </p>
      ) : null}
      {children ? <div className="mt-3 flex flex-wrap items-end gap-2">{children}</div> : null}
    </article>
  );
}

/** The log, newest first, each line in words with the wall-clock time and the count time. */
export function CountLog({ log, plan, limit = 200 }: { log: readonly LogEntry[]; plan: CountState['plan']; limit?: number }) {
  const lines = [...log].reverse().slice(0, limit);
  return (
    <section aria-label="Count log" className="rounded-md border-2 border-line bg-surface p-3">
      <h2 className="mb-2 text-xl font-bold">Log (newest first)</h2>
      {lines.length === 0 ? <p className="text-ink-muted">Nothing logged yet.</p> : null}
      {/* Scrolls on its own: focusable so a keyboard can scroll it too. */}
      <ol tabIndex={0} aria-label="Logged events, newest first" className="flex max-h-96 flex-col gap-1 overflow-y-auto font-mono text-sm">
        {lines.map(({ event, t }) => (
          <li key={event.seq} className={event.type === 'hold:called' || event.type === 'count:scrubbed' ? 'font-bold text-danger' : ''}>
            {clockTime(event.at)} {formatCountClock(t)} {eventWords(event, plan)}
          </li>
        ))}
      </ol>
    </section>
  );
}

/** Category and reason, the two things every hold and scrub needs. */
export function CategoryReasonForm({
  title,
  submitLabel,
  onSubmit,
  onCancel,
  pending,
  error,
  tone = 'danger',
}: {
  title: string;
  submitLabel: string;
  onSubmit: (v: { category: HoldCategory; reason: string }) => void;
  onCancel: () => void;
  pending?: boolean;
  error?: string | null;
  tone?: 'danger' | 'primary';
}) {
  const id = useId();
  const [category, setCategory] = useState<HoldCategory | ''>('');
  const [reason, setReason] = useState('');
  const [problem, setProblem] = useState<{ category?: string; reason?: string }>({});
  return (
    <form
      aria-labelledby={id}
      noValidate
      className="flex flex-col gap-3 rounded-md border-2 border-line bg-surface p-3"
      onSubmit={(e) => {
        e.preventDefault();
        const p = { category: category ? undefined : 'Choose a category', reason: reason.trim() ? undefined : 'Say why' };
        setProblem(p);
        if (p.category || p.reason || !category) return;
        onSubmit({ category, reason: reason.trim() });
      }}
    >
      <h3 id={id} className="text-xl font-bold">
        {title}
      </h3>
      <SelectField
        label="Category"
        value={category}
        placeholder="Choose…"
        options={HOLD_CATEGORIES.map((c) => ({ value: c, label: HOLD_CATEGORY_LABELS[c] }))}
        onChange={(e) => setCategory(e.target.value as HoldCategory)}
        error={problem.category}
      />
      <TextAreaField label="Reason" rows={2} maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} error={problem.reason} />
      {error ? (
        <Notice tone="danger" title="Not done">
          <p>{error}</p>
        </Notice>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant={tone} pending={pending}>
          {submitLabel}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** A button that asks once more before a dangerous command. */
export function ConfirmButton({
  label,
  question,
  confirmLabel,
  onConfirm,
  variant = 'secondary',
  disabled,
  children,
}: {
  label: string;
  question: string;
  confirmLabel: string;
  /** Return false to keep asking (the answer in `children` is not usable yet). */
  onConfirm: () => void | boolean | Promise<void | boolean>;
  variant?: 'primary' | 'secondary' | 'danger';
  disabled?: boolean;
  children?: ReactNode;
}) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant={variant} disabled={disabled} onClick={() => setAsking(true)}>
        {label}
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Confirm: ${label}`} className="flex basis-full flex-col gap-2 rounded-md border-[3px] border-line bg-sunken p-3">
      <p className="font-bold">{question}</p>
      {children}
      <div className="flex flex-wrap gap-2">
        <Button
          variant={variant === 'danger' ? 'danger' : 'primary'}
          onClick={async () => {
            if ((await onConfirm()) !== false) setAsking(false);
          }}
        >
          {confirmLabel}
        </Button>
        <Button variant="quiet" onClick={() => setAsking(false)}>
          Cancel
        </Button>
      </div>
    </div>
  );
}

/** A number field for a reading, with its unit and limits. */
export function ReadingField({ step, onRecord }: { step: PlanStep; onRecord: (value: number) => void }) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | undefined>();
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        const value = Number(text.replace(',', '.'));
        if (text.trim() === '' || !Number.isFinite(value)) {
          setError('Enter the reading as a number');
          return;
        }
        setError(undefined);
        onRecord(value);
        setText('');
      }}
    >
      <TextField
        label={`Reading (${step.unit ?? 'no unit'})`}
        hint={`Limits: ${step.min ?? 'none'} to ${step.max ?? 'none'} ${step.unit ?? ''}`}
        inputMode="decimal"
        value={text}
        onChange={(e) => setText(e.target.value)}
        error={error}
      />
      <Button type="submit" variant="primary">
        Record reading
      </Button>
    </form>
  );
}
