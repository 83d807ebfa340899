import { useId } from 'react';

const W = 720;
const H = 240;
const PAD = { left: 84, right: 16, top: 16, bottom: 40 };

/** A rounded-up scale top: 1, 2 or 5 × a power of ten. */
function niceTop(max: number): number {
  if (max <= 0) return 100;
  const power = 10 ** Math.floor(Math.log10(max));
  for (const step of [1, 2, 5, 10]) if (step * power >= max) return step * power;
  return 10 * power;
}

export interface Bar {
  key: string;
  label: string;
  value: number;
}

/**
 * Bars for amounts by period as SVG (no chart library), with a zero line; negative bars (a month
 * of credit notes) hang below it. Title and description for screen readers; figures are in the
 * table beside it.
 */
export function BarChart({ title, description, bars, format }: { title: string; description: string; bars: Bar[]; format: (minor: number) => string }) {
  const titleId = useId();
  const descId = useId();
  const top = niceTop(Math.max(...bars.map((b) => b.value), 0));
  const bottom = -niceTop(Math.max(...bars.map((b) => -b.value), 0)) * (bars.some((b) => b.value < 0) ? 1 : 0);
  const span = top - bottom;
  const y = (v: number) => PAD.top + ((top - v) / span) * (H - PAD.top - PAD.bottom);
  const slot = (W - PAD.left - PAD.right) / Math.max(1, bars.length);
  const every = Math.max(1, Math.ceil(bars.length / 8));
  const ticks = bottom < 0 ? [bottom, 0, top] : [0, top / 2, top];
  return (
    <figure className="rounded-lg border-2 border-line bg-surface p-4">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={`${titleId} ${descId}`} className="h-auto w-full">
        <title id={titleId}>{title}</title>
        <desc id={descId}>{description}</desc>
        {ticks.map((t) => (
          <g key={t}>
            <line x1={PAD.left} x2={W - PAD.right} y1={y(t)} y2={y(t)} className="stroke-line" strokeWidth={1} strokeDasharray={t === 0 ? undefined : '4 4'} />
            <text x={PAD.left - 8} y={y(t) + 4} textAnchor="end" className="fill-ink-muted font-mono text-[12px]">
              {format(t)}
            </text>
          </g>
        ))}
        {bars.map((b, i) => {
          const x = PAD.left + i * slot + slot * 0.15;
          const yTop = y(Math.max(0, b.value));
          const height = Math.abs(y(b.value) - y(0));
          return (
            <g key={b.key}>
              <rect x={x} y={yTop} width={slot * 0.7} height={Math.max(height, b.value === 0 ? 0 : 1)} className={b.value < 0 ? 'fill-fail' : 'fill-accent'} />
              {i % every === 0 && (
                <text x={x + slot * 0.35} y={H - 14} textAnchor="middle" className="fill-ink-muted text-[12px]">
                  {b.label}
                </text>
              )}
            </g>
          );
        })}
      </svg>
    </figure>
  );
}
