import type { ValueHistory } from '@tappet/contracts';
import { Num } from '@tappet/ui';
import { useId } from 'react';
import { money } from './words';

const W = 720;
const H = 240;
const PAD = { left: 84, right: 16, top: 16, bottom: 36 };

/** A rounded-up scale top: 1, 2 or 5 × a power of ten. */
function niceTop(max: number): number {
  if (max <= 0) return 100;
  const power = 10 ** Math.floor(Math.log10(max));
  for (const step of [1, 2, 5, 10]) if (step * power >= max) return step * power;
  return 10 * power;
}

/** Stock value over time as an SVG line with its figures in a table beside it (no chart library). */
export function ValueChart({ history }: { history: ValueHistory }) {
  const titleId = useId();
  const descId = useId();
  const points = history.points;
  const top = niceTop(Math.max(...points.map((p) => p.valueMinor), 0));
  const x = (i: number) => PAD.left + (points.length <= 1 ? 0 : (i * (W - PAD.left - PAD.right)) / (points.length - 1));
  const y = (v: number) => PAD.top + (1 - v / top) * (H - PAD.top - PAD.bottom);
  const line = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(i).toFixed(1)},${y(p.valueMinor).toFixed(1)}`).join(' ');
  const area = points.length ? `${line} L${x(points.length - 1).toFixed(1)},${y(0)} L${x(0).toFixed(1)},${y(0)} Z` : '';
  const first = points[0];
  const last = points.at(-1);
  const label = (date: string) => new Date(`${date}T00:00:00Z`).toLocaleDateString('en-GB', { month: 'short', year: 'numeric', timeZone: 'UTC' });
  const ticks = [0, top / 2, top];
  const every = Math.max(1, Math.ceil(points.length / 6));

  return (
    <figure className="rounded-lg border-2 border-line bg-surface p-4">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={`${titleId} ${descId}`} className="h-auto w-full">
        <title id={titleId}>Stock value over time</title>
        <desc id={descId}>{first && last ? `From ${money(first.valueMinor, history.currency)} at the end of ${label(first.date)} to ${money(last.valueMinor, history.currency)} today.` : 'No movements yet.'}</desc>
        {ticks.map((t) => (
          <g key={t}>
            <line x1={PAD.left} x2={W - PAD.right} y1={y(t)} y2={y(t)} className="stroke-line" strokeWidth={1} strokeDasharray={t === 0 ? undefined : '4 4'} />
            <text x={PAD.left - 8} y={y(t) + 4} textAnchor="end" className="fill-ink-muted font-mono text-[12px]">
              {money(t, history.currency)}
            </text>
          </g>
        ))}
        <path d={area} className="fill-accent/15" />
        <path d={line} fill="none" className="stroke-accent" strokeWidth={3} strokeLinejoin="round" />
        {points.map((p, i) =>
          i % every === 0 || i === points.length - 1 ? (
            <text key={p.date} x={x(i)} y={H - 12} textAnchor={i === points.length - 1 ? 'end' : 'middle'} className="fill-ink-muted text-[12px]">
              {i === points.length - 1 ? 'Today' : label(p.date)}
            </text>
          ) : null,
        )}
        {last && <circle cx={x(points.length - 1)} cy={y(last.valueMinor)} r={5} className="fill-accent" />}
      </svg>
      <details className="mt-3">
        <summary className="min-h-touch cursor-pointer font-bold">Show the figures</summary>
        <table className="mt-2 w-full max-w-md">
          <caption className="sr-only">Stock value at each month end</caption>
          <thead>
            <tr>
              <th scope="col" className="text-left">
                Date
              </th>
              <th scope="col" className="text-right">
                Value
              </th>
            </tr>
          </thead>
          <tbody>
            {points.map((p) => (
              <tr key={p.date}>
                <td>
                  <Num>{p.date}</Num>
                </td>
                <td className="text-right">
                  <Num>{money(p.valueMinor, history.currency)}</Num>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
