// A short tone for every scan answer: high and brief when it is right, low and longer when it is
// refused, so a picker knows without looking. WebAudio, made on the device (no sound files).
import { useCallback, useRef } from 'react';

export function useScanSound() {
  const ctx = useRef<AudioContext | null>(null);
  return useCallback((ok: boolean) => {
    try {
      const Ctor = window.AudioContext ?? (window as unknown as { webkitAudioContext?: typeof AudioContext }).webkitAudioContext;
      if (!Ctor) return;
      ctx.current ??= new Ctor();
      const ac = ctx.current;
      const osc = ac.createOscillator();
      const gain = ac.createGain();
      osc.type = ok ? 'sine' : 'square';
      osc.frequency.value = ok ? 1320 : 220;
      const length = ok ? 0.12 : 0.45;
      gain.gain.setValueAtTime(0.2, ac.currentTime);
      gain.gain.exponentialRampToValueAtTime(0.001, ac.currentTime + length);
      osc.connect(gain).connect(ac.destination);
      osc.start();
      osc.stop(ac.currentTime + length);
    } catch {
      // No audio on this device: the colour and the words still say it.
    }
  }, []);
}
