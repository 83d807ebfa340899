// Schema-free: screens import these values without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

/** Where a vehicle stands in the shop. `handed_over` ends a customer's visit; `sold` ends shop stock. */
export const vehicleStatuses = ['arrived', 'assessing', 'in_work', 'ready', 'handed_over', 'sold'] as const;
export type VehicleStatus = (typeof vehicleStatuses)[number];

/** The statuses in words, as the screens show them and the API's messages quote them. */
export const vehicleStatusLabels: Record<VehicleStatus, string> = {
  arrived: 'Arrived',
  assessing: 'Being assessed',
  in_work: 'In work',
  ready: 'Ready',
  handed_over: 'Handed over',
  sold: 'Sold',
};
