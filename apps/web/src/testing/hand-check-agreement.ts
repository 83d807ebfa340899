import fc from 'fast-check';
import { expect } from 'vitest';

// Tests of the hand-written answer checks (lib/hand-check.ts): each must accept and refuse what
// its contract's zod schema does, and give the same value when both accept.

interface Check {
  safeParse(data: unknown): { success: boolean; data?: unknown };
}

export function expectAgreement(check: Check, schema: Check, data: unknown) {
  const contract = schema.safeParse(data);
  const hand = check.safeParse(data);
  expect(hand.success).toBe(contract.success);
  if (hand.success && contract.success) expect(hand.data).toEqual(contract.data);
}

/** Every path to a value inside `value` (object keys and array indexes). */
function pathsOf(value: unknown, prefix: Array<string | number> = []): Array<Array<string | number>> {
  if (Array.isArray(value)) return value.flatMap((v, i) => [[...prefix, i], ...pathsOf(v, [...prefix, i])]);
  if (typeof value === 'object' && value !== null) return Object.entries(value).flatMap(([k, v]) => [[...prefix, k], ...pathsOf(v, [...prefix, k])]);
  return [];
}

/** A copy of `value` with the value at `path` replaced (or the key removed when `replacement` is the marker). */
const remove = Symbol('remove');
function replaced(value: unknown, path: Array<string | number>, replacement: unknown): unknown {
  const copy = structuredClone(value) as Record<string | number, unknown>;
  let at = copy;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string | number, unknown>;
  const last = path[path.length - 1]!;
  if (replacement === remove) {
    if (Array.isArray(at)) at.splice(last as number, 1);
    else delete at[last];
  } else at[last] = replacement;
  return copy;
}

/**
 * Property: whatever single value of a good answer is changed (to another type, a near-miss of
 * an enum or id, an odd number) or removed, the hand check still agrees with the schema.
 * `nearMisses` are values of the answer's own vocabulary worth trying in every place.
 */
export function expectAgreementOnEveryChange(check: Check, schema: Check, good: unknown, nearMisses: readonly unknown[], numRuns = 2000) {
  const oddValue = fc.oneof(
    fc.constant(remove),
    fc.constantFrom(null, undefined, true, false, 0, -1, 2.5, 1e21, '', [], {}, ['x'], [1], { a: 1 }, ...nearMisses),
    fc.string(),
    fc.integer(),
    fc.double({ noNaN: false }),
  );
  fc.assert(
    fc.property(fc.constantFrom(...pathsOf(good)), oddValue, (path, value) => {
      expectAgreement(check, schema, replaced(good, path, value));
    }),
    { numRuns },
  );
}
