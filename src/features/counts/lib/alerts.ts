/**
 * Getting a station's attention when a poll asks it: a vibration where the phone has one and a short tone
 * made with Web Audio (no audio files to load). Both are best effort: a browser that refuses either still
 * shows the poll.
 */
let audio: AudioContext | null = null;

export function attentionTone(): void {
  try {
    const Ctx = window.AudioContext ?? (window as Window & { webkitAudioContext?: typeof AudioContext }).webkitAudioContext;
    if (!Ctx) return;
    audio ??= new Ctx();
    const osc = audio.createOscillator();
    const gain = audio.createGain();
    osc.type = 'square';
    osc.frequency.value = 880;
    gain.gain.setValueAtTime(0.15, audio.currentTime);
    gain.gain.exponentialRampToValueAtTime(0.0001, audio.currentTime + 0.35);
    osc.connect(gain).connect(audio.destination);
    osc.start();
    osc.stop(audio.currentTime + 0.35);
  } catch {
    // No sound available: the poll is on screen all the same.
  }
}

export function attentionVibrate(): void {
  if (typeof navigator !== 'undefined' && typeof navigator.vibrate === 'function') navigator.vibrate([200, 100, 200]);
}
