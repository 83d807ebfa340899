import type { ReorderSuggestion } from '@tappet/contracts';
import { useId } from 'react';
import { two } from './words';

const W = 640;
const H = 180;
const PAD = { left: 40, right: 12, top: 12, bottom: 28 };
/** Fills for the numbers demand was issued under, told apart by pattern as well as tone. */
const fills = ['var(--color-accent)', 'var(--color-advise)', 'var(--color-ink-muted)', 'var(--color-ok)'];

/**
 * Demand per week over the window, stacked by the number each issue was made under, with a
 * legend; then the projected stock position falling at the mean daily demand over one lead time,
 * against the reorder point. Drawn in SVG (no chart library); a table of the same figures follows
 * for screen readers and exact values.
 */
export function DemandChart({ suggestion }: { suggestion: ReorderSuggestion }) {
  const titleId = useId();
  const numbers = [...new Set(suggestion.history.flatMap((d) => Object.keys(d.byNumber)))];
  // Weeks keep a long window readable: 26 bars rather than 180 slivers.
  const weeks: Array<{ start: string; byNumber: Record<string, number> }> = [];
  suggestion.history.forEach((day, i) => {
    if (i % 7 === 0) weeks.push({ start: day.date, byNumber: {} });
    const week = weeks.at(-1)!;
    for (const [n, q] of Object.entries(day.byNumber)) week.byNumber[n] = (week.byNumber[n] ?? 0) + q;
  });
  const max = Math.max(1, ...weeks.map((w) => Object.values(w.byNumber).reduce((s, q) => s + q, 0)));
  const plotW = W - PAD.left - PAD.right;
  const plotH = H - PAD.top - PAD.bottom;
  const barW = plotW / Math.max(1, weeks.length);

  // Projection: from today's position, falling at d̄ a day for one lead time.
  const lead = Math.max(1, Math.ceil(suggestion.leadTime.days));
  const start = suggestion.supply.position;
  const end = Math.max(0, start - suggestion.demand.meanPerDay * lead);
  const top = Math.max(start, suggestion.reorderPoint, 1) * 1.1;
  const afterArrival = end + suggestion.quantity;
  const top2 = Math.max(top, afterArrival * 1.1);
  const y2 = (v: number) => PAD.top + plotH - (v / top2) * plotH;

  return (
    <div className="flex flex-col gap-6">
      <figure>
        <figcaption id={titleId} className="mb-2 font-bold">
          Demand per week for {suggestion.partNumber}, by the number it was issued under
        </figcaption>
        <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={titleId} className="h-auto w-full max-w-3xl">
          <line x1={PAD.left} x2={W - PAD.right} y1={PAD.top + plotH} y2={PAD.top + plotH} stroke="currentColor" strokeWidth={1} />
          <text x={PAD.left - 6} y={PAD.top + 8} textAnchor="end" fontSize={11} fill="currentColor">
            {two(max)}
          </text>
          <text x={PAD.left - 6} y={PAD.top + plotH} textAnchor="end" fontSize={11} fill="currentColor">
            0
          </text>
          {weeks.map((week, i) => {
            let base = 0;
            return (
              <g key={week.start}>
                {numbers.map((n, j) => {
                  const q = week.byNumber[n] ?? 0;
                  if (q === 0) return null;
                  const h = (q / max) * plotH;
                  base += h;
                  return <rect key={n} x={PAD.left + i * barW + 1} y={PAD.top + plotH - base} width={Math.max(1, barW - 2)} height={h} fill={fills[j % fills.length]} opacity={j % 2 === 1 ? 0.75 : 1} />;
                })}
              </g>
            );
          })}
          <text x={PAD.left} y={H - 8} fontSize={11} fill="currentColor">
            {weeks[0]?.start}
          </text>
          <text x={W - PAD.right} y={H - 8} fontSize={11} textAnchor="end" fill="currentColor">
            {weeks.at(-1)?.start}
          </text>
        </svg>
        <ul className="mt-2 flex flex-wrap gap-4 text-sm">
          {numbers.map((n, j) => (
            <li key={n} className="flex items-center gap-2">
              <svg width="14" height="14" aria-hidden="true">
                <rect width="14" height="14" fill={fills[j % fills.length]} opacity={j % 2 === 1 ? 0.75 : 1} />
              </svg>
              <span className="font-mono">{n}</span>
            </li>
          ))}
        </ul>
      </figure>

      <figure>
        <figcaption className="mb-2 font-bold">Projected stock position over one lead time ({lead} days), against the reorder point</figcaption>
        <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Stock position ${two(start)} today, ${two(end)} after ${lead} days without an order, ${two(afterArrival)} once this order arrives; reorder point ${two(suggestion.reorderPoint)}.`} className="h-auto w-full max-w-3xl">
          <line x1={PAD.left} x2={W - PAD.right} y1={PAD.top + plotH} y2={PAD.top + plotH} stroke="currentColor" strokeWidth={1} />
          <line x1={PAD.left} x2={W - PAD.right} y1={y2(suggestion.reorderPoint)} y2={y2(suggestion.reorderPoint)} stroke="var(--color-fail)" strokeWidth={2} strokeDasharray="6 4" />
          <text x={PAD.left + plotW * 0.4} y={y2(suggestion.reorderPoint) - 4} textAnchor="middle" fontSize={11} fill="currentColor">
            Reorder point {two(suggestion.reorderPoint)}
          </text>
          <polyline points={`${PAD.left},${y2(start)} ${PAD.left + plotW * 0.85},${y2(end)}`} fill="none" stroke="var(--color-accent)" strokeWidth={3} />
          <polyline points={`${PAD.left + plotW * 0.85},${y2(end)} ${PAD.left + plotW * 0.85},${y2(afterArrival)} ${W - PAD.right},${y2(afterArrival)}`} fill="none" stroke="var(--color-ok)" strokeWidth={3} strokeDasharray="2 3" />
          <text x={PAD.left + 4} y={y2(start) - 6} fontSize={11} fill="currentColor">
            Today {two(start)}
          </text>
          <text x={PAD.left + plotW * 0.85 - 6} y={y2(end) - 6} textAnchor="end" fontSize={11} fill="currentColor">
            Day {lead}: {two(end)}
          </text>
          <text x={W - PAD.right} y={y2(afterArrival) - 6} textAnchor="end" fontSize={11} fill="currentColor">
            With this order {two(afterArrival)}
          </text>
        </svg>
      </figure>
    </div>
  );
}
