// Small pieces for the answers the first screen checks by hand instead of with their zod schemas
// (docs/decisions/024-mobile-first-load.md): each throws Mismatch on a value the contract refuses,
// and `handChecked` turns a reader into the `safeParse` shape the API client calls. Each hand check
// has a test holding it to the contract's schema, case by case.

export type Checked<T> = { success: true; data: T } | { success: false };

export class Mismatch extends Error {}

export function record(v: unknown): Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new Mismatch();
  return v as Record<string, unknown>;
}
export function text(v: unknown): string {
  if (typeof v !== 'string') throw new Mismatch();
  return v;
}
export function textOrNull(v: unknown): string | null {
  return v === null ? null : text(v);
}

// The pattern zod's z.uuid() uses (RFC 9562 versions 1–8, plus the nil and max ids).
const uuid = /^([0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[1-8][0-9a-fA-F]{3}-[89abAB][0-9a-fA-F]{3}-[0-9a-fA-F]{12}|00000000-0000-0000-0000-000000000000|ffffffff-ffff-ffff-ffff-ffffffffffff)$/;

/** zod's z.uuid(). */
export function id(v: unknown): string {
  if (!uuid.test(text(v))) throw new Mismatch();
  return v as string;
}
export function idOrNull(v: unknown): string | null {
  return v === null ? null : id(v);
}
export function flag(v: unknown): boolean {
  if (typeof v !== 'boolean') throw new Mismatch();
  return v;
}
/** zod's z.number(): a finite number. */
export function finite(v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new Mismatch();
  return v;
}
export function finiteOrNull(v: unknown): number | null {
  return v === null ? null : finite(v);
}
/** zod's z.number().int(): a safe integer. */
export function integer(v: unknown): number {
  if (!Number.isSafeInteger(v)) throw new Mismatch();
  return v as number;
}
export function integerOrNull(v: unknown): number | null {
  return v === null ? null : integer(v);
}
export function oneOf<T extends string>(values: readonly T[], v: unknown): T {
  if (!(values as readonly unknown[]).includes(v)) throw new Mismatch();
  return v as T;
}

/** zod's z.array(item). */
export function list<T>(v: unknown, item: (v: unknown) => T): T[] {
  if (!Array.isArray(v)) throw new Mismatch();
  return v.map((x) => item(x));
}

/** A reader (which throws Mismatch) as a schema with zod's `safeParse`. */
export function handChecked<T>(read: (data: unknown) => T): { safeParse(data: unknown): Checked<T> } {
  return {
    safeParse(data) {
      try {
        return { success: true, data: read(data) };
      } catch (error) {
        if (error instanceof Mismatch) return { success: false };
        throw error;
      }
    },
  };
}
