import { Button, useToast } from '@tappet/ui';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { createInvoiceFromJob } from '../api/write-sales';
import { useSalesMutation } from '../api/sales-mutation';

/**
 * Drafts an invoice from a job (its issued parts at sell prices and its labour) and opens it; when
 * the job already has one, opens that instead. For the job screen to show to those who may invoice.
 */
export function InvoiceFromJobButton({ shopId, jobId }: { shopId: string; jobId: string }) {
  const navigate = useNavigate();
  const toast = useToast();
  const create = useSalesMutation(shopId, createInvoiceFromJob);
  return (
    <Button
      variant="secondary"
      loading={create.isPending}
      onClick={() =>
        create.mutate(jobId, {
          onSuccess: (inv) => navigate(paths.shop.salesInvoice.getHref(shopId, inv.id)),
          onError: (error) => {
            const existing = error instanceof ApiError && (error.details as { invoiceId?: string } | undefined)?.invoiceId;
            if (existing) navigate(paths.shop.salesInvoice.getHref(shopId, existing));
            else toast.show(errorMessage(error), 'fail');
          },
        })
      }
    >
      Invoice this job
    </Button>
  );
}
