import { maxLabelBinsPerRequest } from '@tappet/contracts';
import { Button, Dialog, PartNumber } from '@tappet/ui';
import { useId, useState } from 'react';
import { PrintLabelsDialog } from './print-labels-dialog';

export interface PrintableBin {
  id: string;
  code: string;
  description: string | null;
  /** Bins out of use start unticked. */
  active?: boolean;
}

/**
 * "Print bin labels" for a list of bins: choose the bins (all in use are ticked to start), then
 * the print dialog (format, and whether to add a label for each part in them).
 */
export function PrintBinLabelsButton({ shopId, bins, label = 'Print bin labels' }: { shopId: string; bins: PrintableBin[]; label?: string }) {
  const [step, setStep] = useState<'closed' | 'choose' | 'print'>('closed');
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const listId = useId();
  const chosenBins = bins.filter((b) => chosen.has(b.id));
  const tooMany = chosenBins.length > maxLabelBinsPerRequest;
  const inUse = () => new Set(bins.filter((b) => b.active !== false).slice(0, maxLabelBinsPerRequest).map((b) => b.id));

  return (
    <>
      <Button
        variant="secondary"
        disabled={bins.length === 0}
        onClick={() => {
          setChosen(inUse());
          setStep('choose');
        }}
      >
        {label}
      </Button>
      {step === 'choose' && (
        <Dialog
          open
          onClose={() => setStep('closed')}
          title="Choose the bins"
          description={`${chosenBins.length} of ${bins.length} chosen.`}
          footer={
            <>
              <Button variant="secondary" onClick={() => setStep('closed')}>
                Cancel
              </Button>
              <Button disabled={chosenBins.length === 0 || tooMany} onClick={() => setStep('print')}>
                Next
              </Button>
            </>
          }
        >
          <div className="flex flex-col gap-3">
            <div className="flex flex-wrap gap-2">
              <Button size="sm" variant="secondary" onClick={() => setChosen(new Set(bins.slice(0, maxLabelBinsPerRequest).map((b) => b.id)))}>
                Choose all
              </Button>
              <Button size="sm" variant="secondary" onClick={() => setChosen(new Set())}>
                Choose none
              </Button>
            </div>
            {tooMany && (
              <p role="alert" className="font-bold">
                Choose at most {maxLabelBinsPerRequest} bins at a time.
              </p>
            )}
            <ul id={listId} aria-label="Bins" className="flex flex-col divide-y divide-line rounded-md border border-line">
              {bins.map((bin) => (
                <li key={bin.id}>
                  <label className="flex min-h-touch items-center gap-3 px-3 py-1">
                    <input
                      type="checkbox"
                      className="h-5 w-5 accent-accent"
                      checked={chosen.has(bin.id)}
                      onChange={(event) =>
                        setChosen((before) => {
                          const next = new Set(before);
                          if (event.target.checked) next.add(bin.id);
                          else next.delete(bin.id);
                          return next;
                        })
                      }
                    />
                    <PartNumber>{bin.code}</PartNumber>
                    <span className="text-ink-muted">{bin.description}</span>
                  </label>
                </li>
              ))}
            </ul>
          </div>
        </Dialog>
      )}
      {step === 'print' && <PrintLabelsDialog shopId={shopId} open onClose={() => setStep('closed')} source={{ kind: 'bins', bins: chosenBins.map((b) => ({ id: b.id, code: b.code })) }} />}
    </>
  );
}
