import type { VehicleDetail } from '@tappet/contracts';
import { Num } from '@tappet/ui';
import type { ReactNode } from 'react';
import { CostPanel } from './cost-panel';
import { FilesPanel } from './files-panel';
import { StatusPanel } from './status-panel';
import { FitmentPanel, NumbersPanel, OdometerPanel, TimelinePanel } from './vehicle-sections';
import { conditionWords, kindWords } from './words';

export interface VehicleViewProps {
  shopId: string;
  vehicle: VehicleDetail;
  canEdit: boolean;
  shopUnit: 'mi' | 'km';
  formatMoney: (minor: number) => string;
  partHref: (partId: string) => string;
  /** Sees the acquisition cost and the cost and margin panel (not mechanics). */
  canSeeMargin?: boolean;
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex flex-col">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="font-bold">{children ?? <span className="font-normal text-ink-muted">—</span>}</dd>
    </div>
  );
}

/** One vehicle: identification, status and moves, numbers check, odometer, photos, documents, timeline and parts that fit. */
export function VehicleView({ shopId, vehicle: v, canEdit, shopUnit, formatMoney, partHref, canSeeMargin = true }: VehicleViewProps) {
  return (
    // Status first at every width: moving the vehicle on is the most common thing done here.
    <div className="flex flex-col gap-6">
      <StatusPanel shopId={shopId} vehicle={v} canMove={canEdit} />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="flex min-w-0 flex-col gap-6">
          <section aria-labelledby="identity-heading" className="rounded-md border border-line bg-surface p-4">
            <h2 id="identity-heading" className="mb-3 text-lg font-bold">
              Identification
            </h2>
            <dl className="grid grid-cols-2 gap-4 sm:grid-cols-3">
              <Fact label="Frame number">{v.frameNumber && <span className="font-mono text-lg">{v.frameNumber}</span>}</Fact>
              <Fact label="Engine number">{v.engineNumber && <span className="font-mono text-lg">{v.engineNumber}</span>}</Fact>
              <Fact label="VIN">
                {v.vin && (
                  <>
                    <span className="font-mono text-lg">{v.vin}</span>
                    {v.vinCheck === 'acknowledged_failure' && <span className="block text-sm font-normal">⚠ Check digit does not match; kept as stamped after a check.</span>}
                    {v.vinCheck === 'passed' && <span className="block text-sm font-normal text-ink-muted">✓ Check digit correct</span>}
                  </>
                )}
              </Fact>
              <Fact label="Kind">{kindWords[v.kind]}</Fact>
              <Fact label={v.kind === 'consignment' ? 'Consignor' : 'Owner'}>{v.customer?.name}</Fact>
              <Fact label="Colour">{v.colour}</Fact>
              <Fact label="Condition">
                {v.condition && (
                  <>
                    {conditionWords[v.condition].label}
                    <span className="block text-sm font-normal text-ink-muted">{conditionWords[v.condition].meaning}</span>
                  </>
                )}
              </Fact>
              {v.kind === 'shop_stock' && canSeeMargin && <Fact label="Acquisition cost">{v.acquisitionCostMinor !== null && <Num>{formatMoney(v.acquisitionCostMinor)}</Num>}</Fact>}
              {v.kind !== 'customer' && <Fact label="Asking price">{v.askingPriceMinor !== null && <Num>{formatMoney(v.askingPriceMinor)}</Num>}</Fact>}
            </dl>
            {v.notes && <p className="mt-4 whitespace-pre-line">{v.notes}</p>}
          </section>
          <FilesPanel shopId={shopId} vehicle={v} canEdit={canEdit} />
          <OdometerPanel shopId={shopId} vehicle={v} shopUnit={shopUnit} canEdit={canEdit} />
          <FitmentPanel shopId={shopId} vehicleId={v.id} partHref={partHref} />
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          {v.kind === 'shop_stock' && canSeeMargin && <CostPanel shopId={shopId} vehicleId={v.id} formatMoney={formatMoney} />}
          <NumbersPanel shopId={shopId} vehicle={v} canEdit={canEdit} />
          <TimelinePanel shopId={shopId} vehicleId={v.id} />
        </div>
      </div>
    </div>
  );
}
