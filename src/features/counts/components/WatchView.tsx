import { useState } from 'react';
import { tAt } from '../../../domain/count/state';
import type { LiveCount } from '../hooks/useLiveCount';
import { useServerNow } from '../hooks/useServerNow';
import { useSpokenCalls } from '../hooks/useSpokenCalls';
import { BigClock, ConnectionBadge, CountLog, HoldBanner, PollTable, SafetyNote, StatusLine, StepCard } from './CountParts';

/** Read-only: for auditors and visitors. Optional spoken T-minus calls. */
export function WatchView({ live }: { live: LiveCount }) {
  const { state } = live;
  const now = useServerNow(live.offset);
  const [speak, setSpeak] = useState(false);
  const t = state ? tAt(state, now) : null;
  useSpokenCalls(speak && state?.status === 'counting', t);
  if (!state?.plan || t === null) return null;
  const plan = state.plan;
  const current = Object.values(state.currentSteps)
    .flat()
    .map((k) => plan.steps.find((s) => s.key === k))
    .filter((s) => s !== undefined);
  const canSpeak = typeof window !== 'undefined' && 'speechSynthesis' in window;
  return (
    <div className="flex flex-col gap-4">
      <BigClock t={t} />
      <StatusLine state={state} />
      <ConnectionBadge connection={live.connection} queued={[]} />
      {canSpeak ? (
        <label className="flex min-h-11 items-center gap-2 font-bold">
          <input type="checkbox" checked={speak} onChange={(e) => setSpeak(e.target.checked)} />
          Speak the T-minus calls (T-10:00, T-5:00, T-1:00, T-30 s, then each second from T-10)
        </label>
      ) : null}
      <HoldBanner state={state} />
      {state.poll ? <PollTable poll={state.poll} now={now} /> : null}
      <section aria-label="Current steps" className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">Now</h2>
        {current.length === 0 ? <p className="text-ink-muted">No step is due.</p> : null}
        {current.map((s) => (
          <StepCard key={s.key} step={s} stepState={state.steps[s.key]} plan={plan} />
        ))}
      </section>
      <CountLog log={live.log} plan={plan} />
      <SafetyNote />
    </div>
  );
}
