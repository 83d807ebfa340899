import { divideRoundHalfEven, MoneyFormatError, parseDecimal, rescale, toSafeMinorUnits } from '../money';

/**
 * Stock valuation by moving weighted-average cost: the average is recomputed on each receipt
 * (IAS 2 ¶27, "as each additional shipment is received"); issues leave it unchanged.
 *
 * Rounding policy (see money/money.ts for the money-wide rules):
 * - Quantities are exact decimals of up to 4 places (litres of oil, metres of hose); more is refused.
 * - The stock value is an integer of minor units. The unit cost is never stored: it is the exact
 *   ratio value / quantity, reported rounded to 4 decimal places of a minor unit for display only.
 * - Rounding happens at exactly two places, each once, half to even:
 *   a receipt's value (quantity × unit cost, when the product has fractions of a minor unit), and
 *   an issue's cost (value × issued / on hand). So issuing everything takes exactly the whole value,
 *   value = quantity × (exact) unit cost by construction, and the reported 4-decimal unit cost is
 *   off by at most quantity × 0.00005 minor units.
 * - Value flows are conserved to the minor unit: opening + receipts + returns − issues = closing.
 */

/** A quantity or unit cost as a decimal: a number (its shortest decimal is used) or decimal text. */
export type DecimalInput = number | string;

/** One movement of the stock ledger, in ledger order. Money is in minor units (unit costs may have decimals). */
export type StockMovement =
  /** Goods received at a unit cost (e.g. 380 for 3.80 a unit, "333.3333" for a third of 10.00). */
  | { kind: 'receipt'; quantity: DecimalInput; unitCost: DecimalInput }
  /** Goods received for an invoice line total, which is taken exactly. */
  | { kind: 'receipt'; quantity: DecimalInput; totalCost: number }
  /** Goods issued to a job or sold: leaves at the current average cost. Also a return to a supplier. */
  | { kind: 'issue'; quantity: DecimalInput }
  /** Goods coming back to stock from a job: at the cost they were issued at, or the current average. */
  | { kind: 'return'; quantity: DecimalInput; unitCost?: DecimalInput }
  /** A correction (damage, found stock): out at the average; in at the given cost or the average. */
  | { kind: 'adjustment'; quantityDelta: DecimalInput; unitCost?: DecimalInput }
  /** A stock count: the difference to the counted quantity is adjusted as above. */
  | { kind: 'count'; countedQuantity: DecimalInput; unitCost?: DecimalInput };

/** A stock position: what is on hand and what it is worth. */
export interface ValuationSummary {
  /** Quantity on hand. */
  quantity: number;
  /** Stock value, integer minor units. */
  value: number;
  /** Average cost per unit in minor units, rounded to 4 decimals; null when nothing is on hand. */
  unitCost: number | null;
}

/** The position after a movement, with the movement and the value it moved. */
export interface ValuationStep extends ValuationSummary {
  movement: StockMovement;
  /** Value the movement added (positive) or took out (negative), integer minor units. */
  valueChange: number;
}

/** An opening position to continue from (a stored snapshot or a beginning inventory). */
export interface OpeningPosition {
  quantity: DecimalInput;
  /** Integer minor units. */
  value: number;
}

/** Why a movement was refused. */
export type ValuationErrorCode = 'insufficient_stock' | 'no_cost_basis' | 'invalid_movement';

/** A refused movement: the ledger is not changed by it. `step` is its index in the sequence. */
export class ValuationError extends Error {
  override readonly name = 'ValuationError';
  constructor(
    readonly code: ValuationErrorCode,
    message: string,
    readonly step: number,
  ) {
    super(`${message} (movement ${step})`);
  }
}

const QUANTITY_SCALE = 4;
const QUANTITY_ONE = 10n ** BigInt(QUANTITY_SCALE);
const UNIT_COST_SCALE = 10n ** 4n;

/** The exact state: quantity in ten-thousandths of a unit, value in minor units. */
interface ExactPosition {
  quantity: bigint;
  value: bigint;
}

function quantityOf(input: DecimalInput, step: number, what: string): bigint {
  try {
    const scaled = rescale(parseDecimal(input), QUANTITY_SCALE);
    if (scaled === null) throw new ValuationError('invalid_movement', `${what} has more than ${QUANTITY_SCALE} decimals`, step);
    return scaled;
  } catch (error) {
    if (error instanceof MoneyFormatError) throw new ValuationError('invalid_movement', `${what} is not a number`, step);
    throw error;
  }
}

function positiveQuantity(input: DecimalInput, step: number, what: string): bigint {
  const quantity = quantityOf(input, step, what);
  if (quantity <= 0n) throw new ValuationError('invalid_movement', `${what} must be more than zero`, step);
  return quantity;
}

/** Value of `quantity` (ten-thousandths) at a unit cost in minor units, rounded half to even. */
function valueAtUnitCost(quantity: bigint, unitCost: DecimalInput, step: number): bigint {
  let cost;
  try {
    cost = parseDecimal(unitCost);
  } catch {
    throw new ValuationError('invalid_movement', 'unit cost is not a number', step);
  }
  if (cost.coefficient < 0n) throw new ValuationError('invalid_movement', 'unit cost must not be negative', step);
  return divideRoundHalfEven(quantity * cost.coefficient, QUANTITY_ONE * 10n ** BigInt(cost.scale));
}

/** Value of `quantity` at the current average cost, rounded half to even. */
function valueAtAverage(position: ExactPosition, quantity: bigint, step: number): bigint {
  if (position.quantity === 0n) throw new ValuationError('no_cost_basis', 'nothing on hand to take an average cost from; give a unit cost', step);
  return divideRoundHalfEven(position.value * quantity, position.quantity);
}

function stockIn(position: ExactPosition, quantity: bigint, unitCost: DecimalInput | undefined, step: number): bigint {
  return unitCost === undefined ? valueAtAverage(position, quantity, step) : valueAtUnitCost(quantity, unitCost, step);
}

function stockOut(position: ExactPosition, quantity: bigint, step: number): bigint {
  if (quantity > position.quantity) {
    throw new ValuationError('insufficient_stock', `cannot take out ${decimalText(quantity)} with ${decimalText(position.quantity)} on hand`, step);
  }
  // The proportional share, rounded once; taking everything takes exactly the whole value.
  return divideRoundHalfEven(position.value * quantity, position.quantity);
}

/** The value change a movement makes, and the quantity change, without changing anything. */
function effectOf(position: ExactPosition, movement: StockMovement, step: number): { quantity: bigint; value: bigint } {
  switch (movement.kind) {
    case 'receipt': {
      const quantity = positiveQuantity(movement.quantity, step, 'receipt quantity');
      if ('totalCost' in movement) {
        if (!Number.isSafeInteger(movement.totalCost) || movement.totalCost < 0) {
          throw new ValuationError('invalid_movement', 'total cost must be a whole number of minor units ≥ 0', step);
        }
        return { quantity, value: BigInt(movement.totalCost) };
      }
      return { quantity, value: valueAtUnitCost(quantity, movement.unitCost, step) };
    }
    case 'issue': {
      const quantity = positiveQuantity(movement.quantity, step, 'issue quantity');
      return { quantity: -quantity, value: -stockOut(position, quantity, step) };
    }
    case 'return': {
      const quantity = positiveQuantity(movement.quantity, step, 'return quantity');
      return { quantity, value: stockIn(position, quantity, movement.unitCost, step) };
    }
    case 'adjustment':
    case 'count': {
      const delta =
        movement.kind === 'adjustment'
          ? quantityOf(movement.quantityDelta, step, 'adjustment')
          : quantityOf(movement.countedQuantity, step, 'counted quantity') - position.quantity;
      if (movement.kind === 'count' && delta + position.quantity < 0n) {
        throw new ValuationError('invalid_movement', 'a counted quantity cannot be negative', step);
      }
      if (delta === 0n) return { quantity: 0n, value: 0n };
      if (delta < 0n) return { quantity: delta, value: -stockOut(position, -delta, step) };
      return { quantity: delta, value: stockIn(position, delta, movement.unitCost, step) };
    }
  }
}

function decimalText(quantity: bigint): string {
  const negative = quantity < 0n;
  const digits = (negative ? -quantity : quantity).toString().padStart(QUANTITY_SCALE + 1, '0');
  const whole = digits.slice(0, -QUANTITY_SCALE);
  const fraction = digits.slice(-QUANTITY_SCALE).replace(/0+$/, '');
  return `${negative ? '-' : ''}${whole}${fraction ? `.${fraction}` : ''}`;
}

/** Quantity, value and unit cost of an exact position, for people and the API. */
function summaryOf(position: ExactPosition): ValuationSummary {
  return {
    quantity: Number(decimalText(position.quantity)),
    value: toSafeMinorUnits(position.value),
    unitCost:
      position.quantity === 0n
        ? null
        : Number(divideRoundHalfEven(position.value * QUANTITY_ONE * UNIT_COST_SCALE, position.quantity)) / Number(UNIT_COST_SCALE),
  };
}

function openingOf(opening: OpeningPosition): ExactPosition {
  const quantity = quantityOf(opening.quantity, -1, 'opening quantity');
  if (quantity < 0n || !Number.isSafeInteger(opening.value) || opening.value < 0 || (quantity === 0n && opening.value !== 0)) {
    throw new ValuationError('invalid_movement', 'the opening position must be a quantity ≥ 0 and a value ≥ 0 (0 when nothing is on hand)', -1);
  }
  return { quantity, value: BigInt(opening.value) };
}

const EMPTY: OpeningPosition = { quantity: 0, value: 0 };

/**
 * Folds stock movements, in ledger order, into the position after each one: quantity, value and
 * moving-average unit cost. A movement that would take out more than is on hand, or bring stock in
 * at the average when there is none, throws a ValuationError naming the step; nothing is ever
 * negative. Pure: the same movements always give the same steps.
 */
export function valueMovements(movements: readonly StockMovement[], opening: OpeningPosition = EMPTY): ValuationStep[] {
  let position = openingOf(opening);
  return movements.map((movement, step) => {
    const effect = effectOf(position, movement, step);
    position = { quantity: position.quantity + effect.quantity, value: position.value + effect.value };
    return { movement, ...summaryOf(position), valueChange: toSafeMinorUnits(effect.value) };
  });
}

/** The position after all movements (the opening position when there are none). */
export function closingPosition(movements: readonly StockMovement[], opening: OpeningPosition = EMPTY): ValuationSummary {
  let position = openingOf(opening);
  movements.forEach((movement, step) => {
    const effect = effectOf(position, movement, step);
    position = { quantity: position.quantity + effect.quantity, value: position.value + effect.value };
  });
  return summaryOf(position);
}
