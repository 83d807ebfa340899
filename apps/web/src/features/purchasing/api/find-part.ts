import { ApiError, errorMessage } from '../../../lib/api-client';
import { resolveNumber } from './resolve-number';

/** The catalogue part a typed number names, or an error message for the field. */
export async function partFor(shopId: string, number: string): Promise<{ id: string; number: string } | string> {
  if (!number.trim()) return 'Enter the part number.';
  try {
    const found = await resolveNumber(shopId, number.trim());
    return found.part ? { id: found.part.id, number: found.part.number } : `No part numbered ${number.trim()} in the catalogue.`;
  } catch (error) {
    return error instanceof ApiError && error.status === 404 ? `No part numbered ${number.trim()} in the catalogue.` : errorMessage(error);
  }
}
