/**
 * Specific identification for items that are not ordinarily interchangeable (IAS 2 ¶23–24): a
 * numbered engine, a frame, a whole vehicle. Each item keeps its own cost; nothing is averaged.
 */

/** A movement of one serialised item. Costs are integer minor units. */
export type SerialMovement = { kind: 'receipt'; serial: string; cost: number } | { kind: 'issue'; serial: string };

/** What is on hand after the movements, and what the issues cost. */
export interface SerialPosition {
  /** Items on hand with their own costs, in order of receipt. */
  onHand: { serial: string; cost: number }[];
  /** Sum of the costs on hand, integer minor units. */
  value: number;
  /** Sum of the costs of the items issued, integer minor units. */
  issuedCost: number;
}

/** A refused serialised movement; `step` is its index. */
export class SerialValuationError extends Error {
  override readonly name = 'SerialValuationError';
  constructor(
    readonly code: 'duplicate_serial' | 'unknown_serial' | 'invalid_cost',
    readonly serial: string,
    readonly step: number,
  ) {
    super(`${code}: ${serial} (movement ${step})`);
  }
}

/**
 * Folds receipts and issues of serialised items: an issue takes out exactly the cost that item came
 * in at. Receiving a serial already on hand, or issuing one that is not, throws a SerialValuationError.
 * An item issued and later received again (bought back) comes in at its new cost.
 */
export function valueSerialised(movements: readonly SerialMovement[]): SerialPosition {
  const onHand = new Map<string, number>();
  let issuedCost = 0;
  movements.forEach((movement, step) => {
    if (movement.kind === 'receipt') {
      if (!Number.isSafeInteger(movement.cost) || movement.cost < 0) throw new SerialValuationError('invalid_cost', movement.serial, step);
      if (onHand.has(movement.serial)) throw new SerialValuationError('duplicate_serial', movement.serial, step);
      onHand.set(movement.serial, movement.cost);
      return;
    }
    const cost = onHand.get(movement.serial);
    if (cost === undefined) throw new SerialValuationError('unknown_serial', movement.serial, step);
    onHand.delete(movement.serial);
    issuedCost += cost;
  });
  const items = [...onHand].map(([serial, cost]) => ({ serial, cost }));
  return { onHand: items, value: items.reduce((sum, item) => sum + item.cost, 0), issuedCost };
}
