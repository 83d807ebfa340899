/* eslint-disable @nx/enforce-module-boundaries -- benchmarks load data through the API's own data layer,
   as seeds/demo.ts does (docs/decisions/002-module-boundaries.md). */
// Generated catalogues for the benchmarks: invented numbers in the shapes shops print, invented
// descriptions, replacement and equivalence links, and typos of the kind people make.
import { randomUUID } from 'node:crypto';
import { normalisePartNumber } from '@tappet/domain';
import type { Database } from '../../apps/api/src/db/write-lock';
import { prng } from './harness';

export interface GeneratedPart {
  id: string;
  number: string;
  key: string;
  description: string;
  category: string;
}

export type Rng = () => number;
export const pickWith =
  (rnd: Rng) =>
  <T>(xs: readonly T[]): T =>
    xs[Math.floor(rnd() * xs.length)]!;

const letters = 'ABCDEFGHJKLMNPRSTUVWXYZ'.split('');
const digitChars = '0123456789'.split('');
// Invented wording for generated descriptions.
const things = ['cable', 'seal', 'gasket', 'bearing', 'spring', 'bracket', 'bolt', 'washer', 'switch', 'lever', 'bush', 'shim', 'valve', 'clip', 'hose', 'pipe', 'cover', 'plate', 'nut', 'pin'];
const places = ['clutch', 'brake', 'throttle', 'gearbox', 'fork', 'headlamp', 'cylinder head', 'carburettor', 'dynamo', 'kickstart', 'footrest', 'chain', 'wheel', 'exhaust', 'oil pump'];
const sides = ['', ', front', ', rear', ', left', ', right', ', inner', ', outer', ', early type', ', later type', ', oversize'];
export const categories = ['Brakes', 'Clutch', 'Controls', 'Electrics', 'Engine', 'Exhaust', 'Frame', 'Fuel', 'Gearbox', 'Wheels'];

/** A printed part number in one of four common shapes ("71-3456", "KV-1234", "TR/12345", "ABC-12345"). */
export function generatedNumber(rnd: Rng): string {
  const pick = pickWith(rnd);
  const digits = (n: number) => Array.from({ length: n }, () => pick(digitChars)).join('');
  switch (Math.floor(rnd() * 4)) {
    case 0:
      return `${digits(2)}-${digits(4)}`;
    case 1:
      return `${pick(letters)}${pick(letters)}-${digits(4)}`;
    case 2:
      return `${pick(letters)}${pick(letters)}/${digits(5)}`;
    default:
      return `${pick(letters)}${pick(letters)}${pick(letters)}-${digits(5)}`;
  }
}

/** `count` parts with distinct keys, the same for the same seed. */
export function generateParts(count: number, seed = 1971): GeneratedPart[] {
  const rnd = prng(seed);
  const pick = pickWith(rnd);
  const seen = new Set<string>();
  const parts: GeneratedPart[] = [];
  while (parts.length < count) {
    const number = generatedNumber(rnd);
    const key = normalisePartNumber(number);
    if (seen.has(key)) continue;
    seen.add(key);
    const description = `${pick(places)} ${pick(things)}${pick(sides)}`.replace(/^./, (c) => c.toUpperCase());
    parts.push({ id: randomUUID(), number, key, description, category: pick(categories) });
  }
  return parts;
}

/** One or (for long keys, sometimes) two random edits to a printed number, keeping its look. */
export function typo(number: string, rnd: Rng): string {
  const pick = pickWith(rnd);
  let out = number;
  const edits = normalisePartNumber(number).length >= 8 && rnd() < 0.3 ? 2 : 1;
  for (let e = 0; e < edits; e++) {
    const positions = [...out].map((c, i) => (/[A-Z0-9]/.test(c) ? i : -1)).filter((i) => i >= 0);
    const i = pick(positions);
    const kind = Math.floor(rnd() * 4);
    const c = pick(digitChars);
    if (kind === 0) out = out.slice(0, i) + out.slice(i + 1);
    else if (kind === 1) out = out.slice(0, i) + c + out.slice(i);
    else if (kind === 2) out = out.slice(0, i) + c + out.slice(i + 1);
    else {
      const j = positions[positions.indexOf(i) + 1];
      if (j !== undefined) out = out.slice(0, i) + out[j] + out.slice(i + 1, j) + out[i] + out.slice(j + 1);
    }
  }
  return out;
}

/** Inserts parts in chunks through the write lock (the lookup index follows by trigger). */
export async function insertParts(db: Database, shopId: string, rows: readonly GeneratedPart[]): Promise<void> {
  const now = new Date().toISOString();
  for (let i = 0; i < rows.length; i += 400) {
    const chunk = rows.slice(i, i + 400);
    await db.write((m) =>
      m.query(
        `INSERT INTO parts (id, shop_id, number, key, description, origin, maker, category, unit, status, notes, created_at, updated_at) VALUES ${chunk.map(() => `(?, ?, ?, ?, ?, 'genuine', NULL, ?, 'each', 'available', NULL, ?, ?)`).join(', ')}`,
        chunk.flatMap((p) => [p.id, shopId, p.number, p.key, p.description, p.category, now, now]),
      ),
    );
  }
}

/** `count` links from older to newer parts (so replacements never loop): 70 % replacements, the rest equivalents. */
export async function insertLinks(db: Database, shopId: string, parts: readonly GeneratedPart[], count: number, seed = 1972): Promise<void> {
  const rnd = prng(seed);
  const links: unknown[][] = [];
  for (let n = 0; n < count; n++) {
    const a = Math.floor(rnd() * (parts.length - 1));
    const b = a + 1 + Math.floor(rnd() * Math.min(50, parts.length - a - 1));
    const kind = rnd() < 0.7 ? 'replaced_by' : 'equivalent';
    links.push([randomUUID(), shopId, parts[a]!.id, kind, parts[b]!.id, parts[b]!.number, parts[b]!.key, 1, rnd() < 0.5 ? 'both' : 'one_way']);
  }
  for (let i = 0; i < links.length; i += 400) {
    const chunk = links.slice(i, i + 400);
    await db.write((m) =>
      m.query(
        // ON CONFLICT rather than SQLite's OR IGNORE, so the scaling benchmark fills PostgreSQL too.
        `INSERT INTO part_links (id, shop_id, from_part_id, kind, to_part_id, to_number, to_key, quantity, interchange) VALUES ${chunk.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')} ON CONFLICT DO NOTHING`,
        chunk.flat(),
      ),
    );
  }
}

/** The parts as a catalogue CSV (the import's own columns), for import benchmarks. */
export function partsCsv(parts: readonly GeneratedPart[]): string {
  const quote = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  return ['number,description,category', ...parts.map((p) => `${quote(p.number)},${quote(p.description)},${quote(p.category)}`)].join('\n') + '\n';
}
