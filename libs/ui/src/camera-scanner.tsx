import { useCallback, useEffect, useId, useRef, useState, type FormEvent, type SVGProps } from 'react';
import { startBarcodeEngine, type BarcodeEngine } from './barcode-engine';
import { Button, type ButtonProps } from './button';
import { Dialog } from './dialog';
import { TextField } from './form-field';
import { Spinner } from './spinner';

/** Why the camera is not scanning, each with its own words. */
export type CameraProblem = 'unavailable' | 'denied' | 'no-camera' | 'busy' | 'failed' | 'reader-failed';

/** What a person reads for each problem: what happened, and what to do. */
export const cameraProblemMessages: Record<CameraProblem, string> = {
  unavailable: 'This browser cannot use a camera here: cameras work only on a secure (https) page in a current browser. Type the number below instead.',
  denied: 'Camera access was refused. To scan, allow the camera for this site in the browser’s settings and try again, or type the number below.',
  'no-camera': 'No camera was found on this device. Type the number below instead.',
  busy: 'The camera is in use by another app or tab. Close that and try again, or type the number below.',
  failed: 'The camera could not be started. Try again, or type the number below.',
  'reader-failed': 'The barcode reader could not be loaded. Check the connection and try again, or type the number below.',
};

/** Sorts a getUserMedia failure into one of our problems (names from the Media Capture spec). */
export function cameraProblemOf(error: unknown): CameraProblem {
  const name = error instanceof Error || (typeof error === 'object' && error !== null && 'name' in error) ? String((error as { name: unknown }).name) : '';
  if (name === 'NotAllowedError' || name === 'SecurityError' || name === 'PermissionDeniedError') return 'denied';
  if (name === 'NotFoundError' || name === 'OverconstrainedError' || name === 'DevicesNotFoundError') return 'no-camera';
  if (name === 'NotReadableError' || name === 'TrackStartError' || name === 'AbortError') return 'busy';
  return 'failed';
}

type ScanState = { kind: 'starting' } | { kind: 'scanning'; engine: BarcodeEngine['kind'] } | { kind: 'problem'; problem: CameraProblem };

export interface CameraScanDialogProps {
  open: boolean;
  onClose: () => void;
  /** The code read (or typed), trimmed; the dialog has already stopped the camera. */
  onDetected: (code: string) => void;
  title?: string;
  /** Label of the typing fallback, e.g. "Part number". */
  typeLabel?: string;
}

/**
 * A dialog that reads one barcode with the device's (rear) camera: Code 128 and QR from our own
 * labels, EAN/UPC from suppliers' packaging. It uses the browser's BarcodeDetector where present
 * and ZXing otherwise (loaded on first use). Typing the number always works as well, and when the
 * camera is unavailable or refused the dialog says why and puts the cursor in the typing field.
 *
 * To use it on another screen (receiving, counts): render `<CameraScanButton onDetected={…} />`
 * beside the screen's own number field and treat the code exactly like a keyboard-wedge scan of
 * that field (look it up, and act at once only on an exact hit).
 */
export function CameraScanDialog({ open, onClose, onDetected, title = 'Scan a barcode', typeLabel = 'Or type the number' }: CameraScanDialogProps) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const typedRef = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<ScanState>({ kind: 'starting' });
  const [attempt, setAttempt] = useState(0);
  const [typed, setTyped] = useState('');
  const [typedError, setTypedError] = useState<string | undefined>();
  const statusId = useId();
  const onDetectedRef = useRef(onDetected);
  useEffect(() => {
    onDetectedRef.current = onDetected;
  }, [onDetected]);

  useEffect(() => {
    if (!open) return;
    let cancelled = false;
    let stream: MediaStream | null = null;
    let engine: BarcodeEngine | null = null;
    const stopAll = () => {
      engine?.stop();
      stream?.getTracks().forEach((t) => t.stop());
      if (videoRef.current) videoRef.current.srcObject = null;
    };
    const fail = (problem: CameraProblem) => {
      if (cancelled) return;
      stopAll();
      setState({ kind: 'problem', problem });
      // Straight to the fallback: the cursor waits in the typing field.
      setTimeout(() => typedRef.current?.focus(), 0);
    };

    void (async () => {
      if (typeof navigator === 'undefined' || !navigator.mediaDevices?.getUserMedia) return fail('unavailable');
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: { ideal: 'environment' } }, audio: false });
      } catch (error) {
        return fail(cameraProblemOf(error));
      }
      if (cancelled) return stopAll();
      const video = videoRef.current;
      if (!video) return stopAll();
      video.srcObject = stream;
      try {
        await video.play();
      } catch {
        // Autoplay of a muted inline video is allowed everywhere we run; a refusal still shows frames.
      }
      try {
        engine = await startBarcodeEngine(video, (code) => {
          if (cancelled) return;
          cancelled = true;
          stopAll();
          navigator.vibrate?.(40);
          onDetectedRef.current(code.trim());
        });
      } catch {
        return fail('reader-failed');
      }
      if (cancelled) return stopAll();
      setState({ kind: 'scanning', engine: engine.kind });
    })();

    return () => {
      cancelled = true;
      stopAll();
    };
  }, [open, attempt]);

  const submitTyped = (event: FormEvent) => {
    event.preventDefault();
    const code = typed.trim();
    if (!code) {
      setTypedError('Type the number, or scan it with the camera.');
      return;
    }
    onDetected(code);
  };

  const problem = state.kind === 'problem' ? state.problem : null;

  return (
    <Dialog open={open} onClose={onClose} title={title} description="Point the camera at a barcode or QR code: Tappet’s own labels (Code 128 or QR) and suppliers’ EAN or UPC codes all work.">
      <div className="flex flex-col gap-4">
        {problem ? (
          <div role="alert" className="flex flex-col gap-3 rounded-md border-2 border-line-strong bg-sunk p-3">
            <p className="font-bold">{problem === 'denied' ? 'Camera access refused' : problem === 'unavailable' ? 'No camera here' : problem === 'no-camera' ? 'No camera found' : 'The camera is not scanning'}</p>
            <p>{cameraProblemMessages[problem]}</p>
            {problem !== 'unavailable' && problem !== 'no-camera' && (
              <div>
                <Button
                  variant="secondary"
                  size="sm"
                  onClick={() => {
                    setState({ kind: 'starting' });
                    setAttempt((n) => n + 1);
                  }}
                >
                  Try the camera again
                </Button>
              </div>
            )}
          </div>
        ) : (
          <div className="relative overflow-hidden rounded-md border-2 border-line" style={{ aspectRatio: '4 / 3', background: '#111' }}>
            <video ref={videoRef} muted playsInline autoPlay aria-label="Camera picture" aria-describedby={statusId} className="h-full w-full object-cover" />
            {/* A frame to aim with; the whole picture is read, not only the frame. */}
            <div aria-hidden="true" className="pointer-events-none absolute inset-x-[12%] inset-y-[25%] rounded-md border-2 border-dashed" style={{ borderColor: '#fff' }} />
            {state.kind === 'starting' && (
              <div className="absolute inset-0 flex items-center justify-center gap-2" style={{ background: 'rgba(0,0,0,0.6)', color: '#fff' }}>
                <Spinner size={20} /> Starting the camera…
              </div>
            )}
          </div>
        )}
        <p id={statusId} role="status" className="text-ink-muted">
          {state.kind === 'scanning' ? 'Looking for a barcode… Hold it steady, about a hand’s width away.' : state.kind === 'starting' ? 'Asking for the camera…' : ''}
        </p>
        <form onSubmit={submitTyped} className="flex flex-wrap items-end gap-2" noValidate>
          <TextField
            ref={typedRef}
            label={typeLabel}
            value={typed}
            error={typedError}
            onChange={(event) => {
              setTyped(event.target.value);
              setTypedError(undefined);
            }}
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            className="font-mono"
            fieldClassName="min-w-0 flex-1"
          />
          <Button type="submit" variant="secondary">
            Use this number
          </Button>
        </form>
      </div>
    </Dialog>
  );
}

function IconCamera(props: SVGProps<SVGSVGElement>) {
  return (
    <svg width={20} height={20} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...props}>
      <path d="M4 8h3l2-3h6l2 3h3v11H4z" />
      <circle cx="12" cy="13" r="3.5" />
    </svg>
  );
}

export interface CameraScanButtonProps extends Omit<ButtonProps, 'onClick' | 'children'> {
  onDetected: (code: string) => void;
  /** Visible words; defaults to "Scan". */
  label?: string;
  dialogTitle?: string;
  typeLabel?: string;
}

/** A "Scan" button that opens the camera scanner and hands over the code read (or typed). */
export function CameraScanButton({ onDetected, label = 'Scan', dialogTitle, typeLabel, variant = 'secondary', ...rest }: CameraScanButtonProps) {
  const [open, setOpen] = useState(false);
  const read = useRef<string | null>(null);
  const close = useCallback(() => setOpen(false), []);
  // Hand the code over once the dialog is gone and has given focus back, so the receiver may
  // move focus (to its number field) without the dialog taking it away again.
  useEffect(() => {
    if (open || read.current === null) return;
    const code = read.current;
    read.current = null;
    onDetected(code);
  }, [open, onDetected]);
  return (
    <>
      <Button variant={variant} icon={<IconCamera />} onClick={() => setOpen(true)} {...rest}>
        {label}
      </Button>
      {open && (
        <CameraScanDialog
          open
          onClose={close}
          title={dialogTitle}
          typeLabel={typeLabel}
          onDetected={(code) => {
            read.current = code;
            setOpen(false);
          }}
        />
      )}
    </>
  );
}
