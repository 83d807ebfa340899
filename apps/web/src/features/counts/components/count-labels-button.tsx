import { Button, buttonClasses, Dialog, FormMessage } from '@tappet/ui';
import { useEffect, useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { usePrintCountLabels } from '../api/print-count-labels';

/**
 * "Print labels" for the bins of a count: the shop's label format, optionally with a label for
 * every part in each bin; the PDF is offered to open or download.
 */
export function CountLabelsButton({ shopId, countId, binCount }: { shopId: string; countId: string; binCount: number }) {
  const [open, setOpen] = useState(false);
  const [contents, setContents] = useState(false);
  const [file, setFile] = useState<{ url: string; fileName: string; labels: number } | null>(null);
  const print = usePrintCountLabels(shopId, countId);
  useEffect(() => () => {
    if (file) URL.revokeObjectURL(file.url);
  }, [file]);
  const close = () => {
    setOpen(false);
    setFile(null);
    print.reset();
  };
  return (
    <>
      <Button variant="secondary" disabled={binCount === 0} onClick={() => setOpen(true)}>
        Print bin labels
      </Button>
      {open && (
        <Dialog
          open
          onClose={close}
          title="Labels for this count’s bins"
          description={`${binCount} ${binCount === 1 ? 'bin' : 'bins'}, in the shop’s label format.`}
          footer={
            file ? (
              <>
                <Button variant="secondary" onClick={close}>
                  Done
                </Button>
                <a href={file.url} download={file.fileName} className={buttonClasses('secondary')}>
                  Download
                </a>
                <a href={file.url} target="_blank" rel="noopener" className={buttonClasses('primary')}>
                  Open the PDF
                </a>
              </>
            ) : (
              <>
                <Button variant="secondary" onClick={close}>
                  Cancel
                </Button>
                <Button loading={print.isPending} onClick={() => print.mutate({ contents }, { onSuccess: (made) => setFile({ url: URL.createObjectURL(made.blob), fileName: made.fileName, labels: made.labels }) })}>
                  Make the labels
                </Button>
              </>
            )
          }
        >
          {print.isError && <FormMessage>{errorMessage(print.error)}</FormMessage>}
          {file ? (
            <p role="status">
              {file.labels} {file.labels === 1 ? 'label is' : 'labels are'} ready. Print at 100&nbsp;% (actual size).
            </p>
          ) : (
            <label className="flex min-h-touch items-center gap-3">
              <input type="checkbox" className="h-5 w-5 accent-accent" checked={contents} onChange={(e) => setContents(e.target.checked)} />
              Add a label for each part in the bins
            </label>
          )}
        </Dialog>
      )}
    </>
  );
}
