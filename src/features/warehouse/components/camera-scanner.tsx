// The phone's camera as a scanner (@zxing/browser, loaded only when asked for): each barcode it
// reads goes through the same path as a typed or wedge-scanned code.
import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button.tsx';

export function CameraScanner({ onCode, onClose }: { onCode: (code: string) => void; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const handler = useRef(onCode);
  useEffect(() => {
    handler.current = onCode;
  }, [onCode]);

  useEffect(() => {
    let stop: (() => void) | null = null;
    let cancelled = false;
    let last = { text: '', at: 0 };
    (async () => {
      try {
        const [{ BrowserMultiFormatReader }, { DecodeHintType }] = await Promise.all([import('@zxing/browser'), import('@zxing/library')]);
        const reader = new BrowserMultiFormatReader(new Map([[DecodeHintType.ASSUME_GS1, true]]));
        const controls = await reader.decodeFromConstraints({ video: { facingMode: 'environment' } }, video.current!, (result) => {
          if (!result) return;
          const text = result.getText();
          // The camera sees the same code many times a second: take it once per 1.5 s.
          if (text === last.text && Date.now() - last.at < 1500) return;
          last = { text, at: Date.now() };
          handler.current(text);
        });
        if (cancelled) controls.stop();
        else stop = () => controls.stop();
      } catch (e) {
        setProblem(e instanceof Error && e.name === 'NotAllowedError' ? 'The camera was not allowed. Allow it in the browser, or type the code.' : 'No camera could be started on this device. Type the code instead.');
      }
    })();
    return () => {
      cancelled = true;
      stop?.();
    };
  }, []);

  return (
    <div className="rounded-lg border border-line bg-black/90 p-2 text-white">
      {problem ? <p className="p-3 text-base">{problem}</p> : <video ref={video} className="mx-auto max-h-64 w-full rounded object-cover" muted playsInline aria-label="Camera view for scanning" />}
      <Button className="mt-2 w-full py-3 text-base" onClick={onClose}>
        Close camera
      </Button>
    </div>
  );
}
