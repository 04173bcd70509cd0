import { useEffect, useRef, useState } from 'react';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { TextAreaField } from '../../../components/ui/SelectField';
import type { Me } from '../../../contract/people';
import { tAt } from '../../../domain/count/state';
import type { CommandResult, LiveCount } from '../hooks/useLiveCount';
import { useServerNow } from '../hooks/useServerNow';
import { useWakeLock } from '../hooks/useWakeLock';
import { attentionTone, attentionVibrate } from '../lib/alerts';
import { BigClock, CategoryReasonForm, ConnectionBadge, HoldBanner, mayClearHold, ReadingField, SafetyNote, StatusLine, StepCard } from './CountParts';
import { HoldButton } from './HoldButton';

/** A station's phone: its clock, its steps, its poll answer, and HOLD always at the bottom. */
export function StationPanel({ live, me, station, manned }: { live: LiveCount; me: Me; station: string; manned: readonly string[] }) {
  const { state, send } = live;
  const now = useServerNow(live.offset);
  const [problem, setProblem] = useState<string | null>(null);
  const [holdForm, setHoldForm] = useState(false);
  const [nogo, setNogo] = useState(false);
  const [nogoReason, setNogoReason] = useState('');
  const [nogoError, setNogoError] = useState<string | undefined>();
  useWakeLock(true);

  const poll = state?.poll ?? null;
  const asked = poll !== null && poll.stations.includes(station) && !poll.answers[station];
  const alerted = useRef<string | null>(null);
  useEffect(() => {
    if (asked && poll && alerted.current !== poll.pollId) {
      alerted.current = poll.pollId;
      attentionVibrate();
      attentionTone();
    }
    if (!asked) setNogo(false);
  }, [asked, poll]);

  if (!state?.plan) return null;
  const plan = state.plan;

  const run = async (p: Promise<CommandResult>, after?: () => void) => {
    setProblem(null);
    const r = await p;
    if (r.ok) after?.();
    else setProblem(r.error);
  };

  const answer = (value: 'go' | 'nogo', reason?: string) =>
    poll && run(send({ type: 'poll:answer', pollId: poll.pollId, station, answer: value, ...(reason ? { reason } : {}) }), () => setNogo(false));

  const mine = (state.currentSteps[station] ?? []).map((k) => plan.steps.find((s) => s.key === k)).filter((s) => s !== undefined);
  const mineAnswer = poll?.answers[station];

  return (
    <div className="mx-auto flex w-full max-w-xl flex-col gap-4 pb-40">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-2xl font-bold">Station {station}</p>
        <ConnectionBadge connection={live.connection} queued={live.queued} />
      </div>
      <BigClock t={tAt(state, now)} size="large" />
      <StatusLine state={state} />
      <HoldBanner
        state={state}
        canClear={(h) => mayClearHold(h, me, manned)}
        onClear={(h) => void run(send({ type: 'hold:clear', holdId: h.holdId }))}
      />
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

      {asked && poll ? (
        <section aria-label="Your go/no-go" className="rounded-md border-[3px] border-line bg-sunken p-3">
          <p className="text-sm font-bold uppercase">Poll {poll.pollId} asks {station}</p>
          <p className="mb-3 text-xl font-bold">{poll.question}</p>
          {!nogo ? (
            <div className="grid grid-cols-2 gap-3">
              <Button variant="primary" className="min-h-24 text-3xl" onClick={() => void answer('go')}>
                GO
              </Button>
              <Button variant="danger" className="min-h-24 text-3xl" onClick={() => setNogo(true)}>
                NO-GO
              </Button>
            </div>
          ) : (
            <form
              noValidate
              className="flex flex-col gap-3"
              onSubmit={(e) => {
                e.preventDefault();
                if (!nogoReason.trim()) {
                  setNogoError('Say why you are no-go');
                  return;
                }
                setNogoError(undefined);
                void answer('nogo', nogoReason.trim());
                setNogoReason('');
              }}
            >
              <TextAreaField label="Why no-go?" rows={2} maxLength={500} value={nogoReason} onChange={(e) => setNogoReason(e.target.value)} error={nogoError} />
              <div className="flex gap-2">
                <Button type="submit" variant="danger">
                  Send NO-GO
                </Button>
                <Button variant="quiet" onClick={() => setNogo(false)}>
                  Back
                </Button>
              </div>
            </form>
          )}
        </section>
      ) : poll && !poll.stations.includes(station) ? (
        <p className="text-ink-muted">
          Poll {poll.pollId} is open for {poll.stations.join(', ')}: {station} is not asked.
        </p>
      ) : mineAnswer ? (
        <p className="text-lg font-bold">
          You answered {mineAnswer.answer === 'go' ? 'GO' : `NO-GO (${mineAnswer.reason})`} to poll {poll?.pollId}.
        </p>
      ) : null}

      <section aria-label="Your steps" className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">Your steps now</h2>
        {mine.length === 0 ? <p className="text-ink-muted">No step for {station} right now.</p> : null}
        {mine.map((step) => (
          <StepCard key={step.key} step={step} stepState={state.steps[step.key]} plan={plan}>
            {step.kind === 'reading' ? (
              <ReadingField step={step} onRecord={(value) => void run(send({ type: 'reading:record', stepKey: step.key, value }))} />
            ) : step.kind === 'poll' ? (
              <p className="text-ink-muted">Done when its go/no-go poll passes.</p>
            ) : step.kind === 'builtInHold' ? (
              <p className="text-ink-muted">A built-in hold: it ends by itself.</p>
            ) : (
              <Button variant="primary" onClick={() => void run(send({ type: 'step:complete', stepKey: step.key }))}>
                Mark step done
              </Button>
            )}
          </StepCard>
        ))}
      </section>

      <SafetyNote />

      <div className="fixed inset-x-0 bottom-0 z-10 border-t-4 border-line bg-paper p-3">
        <div className="mx-auto max-w-xl">
          {holdForm ? (
            <CategoryReasonForm
              title={`Call a hold from ${station}`}
              submitLabel="Call HOLD"
              onCancel={() => setHoldForm(false)}
              onSubmit={({ category, reason }) => void run(send({ type: 'hold:call', category, reason, station }), () => setHoldForm(false))}
            />
          ) : (
            <HoldButton onHeld={() => setHoldForm(true)} disabled={state.status !== 'counting' && state.status !== 'holding'} />
          )}
        </div>
      </div>
    </div>
  );
}
