import { subjectOf } from '@tappet/permissions';
import { useAppAbility } from '../../../lib/ability';

/**
 * Field-level permission: whether the person may set a vehicle's acquisition cost and asking
 * price (the owner may; a mechanic works on vehicles but not on their money). The API enforces the
 * same rule; this only hides and disables the fields.
 */
export function useCanSetVehicleMoney(shopId: string): boolean {
  const ability = useAppAbility();
  const vehicle = subjectOf('Vehicle', { shopId });
  return ability.can('update', vehicle, 'acquisitionCostMinor') && ability.can('update', vehicle, 'askingPriceMinor');
}
