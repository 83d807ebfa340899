import { Button } from '@tappet/ui';
import { lazy, Suspense, useState } from 'react';
import type { LabelSource } from './print-labels-dialog';

// The dialog (its form, label layouts and checks) loads when first opened, so the pages that show
// the button do not carry it in their first download (docs/decisions/024-mobile-first-load.md).
const PrintLabelsDialog = lazy(() => import('./print-labels-dialog').then((m) => ({ default: m.PrintLabelsDialog })));

/** A "Print labels" button with its dialog, for a part page, a list selection or a bin. */
export function PrintLabelsButton({ shopId, source, label = 'Print labels', variant = 'secondary' }: { shopId: string; source: LabelSource; label?: string; variant?: 'primary' | 'secondary' }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button variant={variant} onClick={() => setOpen(true)}>
        {label}
      </Button>
      {open && (
        <Suspense fallback={null}>
          <PrintLabelsDialog shopId={shopId} source={source} open onClose={() => setOpen(false)} />
        </Suspense>
      )}
    </>
  );
}
