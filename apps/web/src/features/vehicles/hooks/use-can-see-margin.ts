import { subjectOf } from '@tappet/permissions';
import { useAppAbility } from '../../../lib/ability';

/**
 * Field-level permission: whether the person sees what a vehicle cost the shop and its margin
 * (not mechanics). The API refuses the costs to the same people; this only hides the panel.
 */
export function useCanSeeVehicleMargin(shopId: string): boolean {
  return useAppAbility().can('read', subjectOf('Vehicle', { shopId }), 'margin');
}
