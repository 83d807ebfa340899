import type { z } from 'zod';
import { compressionSpread, compressionToStorage, isAtLeastAsSevere, readTyreDate, suggestForCompression, suggestForMeasurement, suggestForTyres, type ItemResult } from '@tappet/domain';
import type { recordItemSchema, TemplateItem } from '@tappet/contracts';
import { HttpError } from '../../lib/http-error';
import type { StoredTyreReading } from './jobs.entity';

export type RecordItem = z.output<typeof recordItemSchema>;

/** What gets stored for an item once its input has been checked against the item's kind and rules. */
export interface CheckedRecord {
  result: ItemResult;
  suggested: ItemResult | null;
  note: string | null;
  value: number | null;
  compressionKPa: number[] | null;
  tyres: StoredTyreReading[] | null;
}

const invalid = (field: string, message: string) => new HttpError(400, 'validation_failed', message, [{ path: [field], message }]);

const words: Record<ItemResult, string> = { ok: 'OK', advise: 'Advise', fail: 'Fail', na: 'Not applicable' };

/**
 * Checks one item's record: the readings its kind needs, converted to the stored unit
 * (compression in kPa), the rules' suggestion, and that the chosen result is not milder than the
 * suggestion (a failed tyre date code cannot be marked OK). `na` carries no readings.
 */
export function checkItemRecord(item: TemplateItem, input: RecordItem, today: Date): CheckedRecord {
  const base = { result: input.result, note: input.note, value: null, compressionKPa: null, tyres: null, suggested: null } satisfies CheckedRecord;
  const hasReadings = input.value !== null || input.compression !== null || (input.tyres !== null && input.tyres.length > 0);
  if (input.result === 'na') {
    if (hasReadings) throw invalid('result', 'An item marked not applicable carries no readings: clear them or choose another result.');
    return base;
  }
  let record: CheckedRecord = base;
  switch (item.kind) {
    case 'check':
      if (hasReadings) throw invalid('value', 'This item takes a result and a note, not readings.');
      break;
    case 'measure': {
      if (input.compression !== null || input.tyres !== null) throw invalid('value', 'This item takes one measured value.');
      if (input.value === null) throw invalid('value', `Enter the measured value${item.unit ? ` in ${item.unit}` : ''}.`);
      record = { ...base, value: input.value, suggested: suggestForMeasurement(input.value, { min: item.min, max: item.max }, item.outsideFails) };
      break;
    }
    case 'compression': {
      if (input.value !== null || input.tyres !== null) throw invalid('compression', 'This item takes a compression reading per cylinder.');
      if (input.compression === null) throw invalid('compression', 'Enter a compression reading for each cylinder.');
      const kPa = input.compression.readings.map((r) => compressionToStorage(r, input.compression!.unit));
      record = { ...base, compressionKPa: kPa, suggested: suggestForCompression(kPa, { min: item.min, max: item.max }, item.outsideFails) };
      break;
    }
    case 'tyre_date': {
      if (input.value !== null || input.compression !== null) throw invalid('tyres', 'This item takes the DOT date code of each tyre.');
      if (input.tyres === null || input.tyres.length === 0) throw invalid('tyres', 'Enter the DOT date code of each tyre.');
      const readings = input.tyres.map((t) => ({ position: t.position, ...readTyreDate(t.code, today) }));
      const unreadable = readings.find((r) => r.verdict === 'unreadable');
      if (unreadable) throw invalid('tyres', `The code “${unreadable.code}” (${unreadable.position}) cannot be read as a date: the last four digits are week and year (e.g. 2319), or three digits for a tyre made before 2000.`);
      record = { ...base, tyres: readings, suggested: suggestForTyres(readings) };
      break;
    }
  }
  if (record.suggested && !isAtLeastAsSevere(record.result, record.suggested)) {
    throw invalid('result', `The readings give “${words[record.suggested]}”: record that or something more severe, and say why in the note.`);
  }
  return record;
}

/** The spread of stored compression readings, for showing. */
export function spreadOf(kPa: number[] | null): number | null {
  if (!kPa || kPa.length < 2) return null;
  return compressionSpread(kPa).spreadPercent;
}
