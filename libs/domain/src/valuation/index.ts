export {
  closingPosition,
  ValuationError,
  valueMovements,
  type DecimalInput,
  type OpeningPosition,
  type StockMovement,
  type ValuationErrorCode,
  type ValuationStep,
  type ValuationSummary,
} from './moving-average';
export { SerialValuationError, valueSerialised, type SerialMovement, type SerialPosition } from './serialised';
