// The buying-choices form's rules, loaded when the form is sent so that zod stays off the part
// page's first load (docs/decisions/029-part-panels-without-zod.md).
export { partPurchasingSchema } from '@tappet/contracts';
