import { useEffect, useRef } from 'react';
import { callFor } from '../lib/calls';

/** Speak the T-minus calls while `enabled`, where the browser can speak. */
export function useSpokenCalls(enabled: boolean, t: number | null): void {
  const prev = useRef<number | null>(null);
  useEffect(() => {
    if (t === null) return;
    // The same whole second the clock shows (floor): it reads T-00:00:10 from the instant ten seconds are left.
    const shown = Math.floor(t);
    const call = callFor(prev.current, shown);
    prev.current = shown;
    if (!enabled || !call || typeof window === 'undefined' || !('speechSynthesis' in window)) return;
    const u = new SpeechSynthesisUtterance(call);
    u.rate = 1.1;
    window.speechSynthesis.speak(u);
  }, [enabled, t]);
}
