// Test helper: small invented catalogues written tersely. Part ids are "id:" + number so tests can
// tell ids and numbers apart.
import { type Interchange, type LineageLink, type LineagePart, type PartStatus } from '../types';

export const idOf = (number: string): string => `id:${number}`;

export function part(number: string, status: PartStatus = 'available'): LineagePart {
  return { id: idOf(number), number, status };
}

interface LinkOptions {
  quantity?: number;
  interchange?: Interchange;
  id?: string;
}

export function replacedBy(from: string, to: string, options: LinkOptions = {}): LineageLink {
  return { kind: 'replaced_by', fromId: idOf(from), toId: idOf(to), quantity: options.quantity ?? 1, interchange: options.interchange ?? 'both', ...(options.id && { id: options.id }) };
}

export function kitContains(kit: string, component: string, quantity = 1): LineageLink {
  return { kind: 'kit_contains', fromId: idOf(kit), toId: idOf(component), quantity, interchange: 'both' };
}

export function equivalent(from: string, to: string, options: LinkOptions = {}): LineageLink {
  return { kind: 'equivalent', fromId: idOf(from), toId: idOf(to), quantity: options.quantity ?? 1, interchange: options.interchange ?? 'both', ...(options.id && { id: options.id }) };
}

/** A link to a number that is not in the catalogue. */
export function toUnknown(kind: LineageLink['kind'], from: string, number: string, options: LinkOptions = {}): LineageLink {
  return { kind, fromId: idOf(from), toId: null, toNumber: number, quantity: options.quantity ?? 1, interchange: options.interchange ?? 'one_way', ...(options.id && { id: options.id }) };
}
