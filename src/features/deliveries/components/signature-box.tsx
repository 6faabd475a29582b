import SignaturePad from 'signature_pad';
import { useEffect, useImperativeHandle, useRef, useState } from 'react';
import type { Ref } from 'react';
import { Button } from '../../../components/ui/button';

export interface SignatureBoxHandle {
  /** The signature as a PNG, or null when nothing is drawn. */
  toPng(): Blob | null;
  clear(): void;
}

interface SignatureBoxProps {
  ref?: Ref<SignatureBoxHandle>;
  /** Called with true after each stroke, false when cleared. */
  onChange: (signed: boolean) => void;
  describedBy?: string;
}

function dataUrlToBlob(dataUrl: string): Blob {
  const [head, data] = dataUrl.split(',', 2);
  const type = /data:([^;]+)/.exec(head ?? '')?.[1] ?? 'image/png';
  const bytes = Uint8Array.from(atob(data ?? ''), (c) => c.charCodeAt(0));
  return new Blob([bytes], { type });
}

/**
 * The receiver signs with a finger in a box (signature_pad on a canvas sized to the device's pixels).
 * People who cannot use the box confirm by typing their name in the field under it instead.
 */
export function SignatureBox({ ref, onChange, describedBy }: SignatureBoxProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const padRef = useRef<SignaturePad | null>(null);
  const [available, setAvailable] = useState(true);
  const onChangeRef = useRef(onChange);
  useEffect(() => {
    onChangeRef.current = onChange;
  });

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return undefined;
    let pad: SignaturePad;
    try {
      if (!canvas.getContext('2d')) throw new Error('no 2D canvas');
      pad = new SignaturePad(canvas, { backgroundColor: 'rgb(255,255,255)', penColor: 'rgb(22,28,37)', minWidth: 1, maxWidth: 3 });
    } catch {
      setAvailable(false);
      return undefined;
    }
    padRef.current = pad;
    const onEnd = () => onChangeRef.current(!pad.isEmpty());
    pad.addEventListener('endStroke', onEnd);
    // Match the canvas to its drawn size and the screen's pixel ratio, keeping what is drawn.
    const fit = () => {
      const ratio = Math.max(window.devicePixelRatio || 1, 1);
      const data = pad.toData();
      canvas.width = canvas.offsetWidth * ratio;
      canvas.height = canvas.offsetHeight * ratio;
      canvas.getContext('2d')?.scale(ratio, ratio);
      pad.clear();
      pad.fromData(data);
    };
    fit();
    window.addEventListener('resize', fit);
    return () => {
      window.removeEventListener('resize', fit);
      pad.removeEventListener('endStroke', onEnd);
      pad.off();
      padRef.current = null;
    };
  }, []);

  const clear = () => {
    padRef.current?.clear();
    onChangeRef.current(false);
  };

  useImperativeHandle(ref, () => ({
    toPng: () => {
      const pad = padRef.current;
      if (!pad || pad.isEmpty()) return null;
      return dataUrlToBlob(pad.toDataURL('image/png'));
    },
    clear,
  }));

  if (!available) {
    return <p className="rounded-md border-2 border-dashed border-ink-300 p-4 text-lg">This phone cannot show the signature box: type the receiver&rsquo;s name below to confirm.</p>;
  }
  return (
    <div className="space-y-2">
      <canvas
        ref={canvasRef}
        role="img"
        aria-label="Signature box: the receiver signs here with a finger"
        aria-describedby={describedBy}
        className="block h-44 w-full touch-none rounded-md border-2 border-ink-400 bg-white"
      />
      <Button variant="secondary" size="lg" className="w-full" onClick={clear}>
        Clear the signature
      </Button>
    </div>
  );
}
