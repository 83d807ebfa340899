/**
 * The checklist templates Tappet ships, written for Tappet. A shop copies them and edits its own
 * copies; the wording here is only the starting point.
 */
import type { UnitId } from '../units/units';
import type { CautionId, ItemKind } from './checklists';

/** One item of a checklist template. Ranges are in `unit` (compression: always kPa). */
export interface ChecklistTemplateItem {
  /** Stable within the template: results are stored against it. Lower-case letters, digits, dashes. */
  key: string;
  section: string;
  label: string;
  /** What to look at, in a sentence or two. */
  guidance: string | null;
  kind: ItemKind;
  /** Safety-critical: failed or unrecorded, it blocks hand-over until the owner signs it off. */
  safety: boolean;
  cautions: CautionId[];
  /** For `measure` items. */
  unit: UnitId | null;
  min: number | null;
  max: number | null;
  /** Outside the range is a failure rather than an advisory. */
  outsideFails: boolean;
}

export interface ChecklistTemplateDefinition {
  name: string;
  description: string;
  items: ChecklistTemplateItem[];
}

const item = (p: Partial<ChecklistTemplateItem> & Pick<ChecklistTemplateItem, 'key' | 'section' | 'label'>): ChecklistTemplateItem => ({
  guidance: null,
  kind: 'check',
  safety: false,
  cautions: [],
  unit: null,
  min: null,
  max: null,
  outsideFails: false,
  ...p,
});

/**
 * A lower bound for cranking compression of 690 kPa (about 100 psi) — from memory, a figure often
 * quoted for a healthy four-stroke; it is a placeholder the shop should replace with the maker's
 * figure for each engine, and the guidance says so.
 */
const COMPRESSION_MIN_KPA_FROM_MEMORY = 690;

/** Recommissioning after long storage. */
export const recommissioningTemplate: ChecklistTemplateDefinition = {
  name: 'Recommissioning after storage',
  description: 'For a vehicle that has stood unused for a season or more: what ages while nothing moves, checked before it runs and before it goes on the road.',
  items: [
    item({ key: 'fuel-tank', section: 'Fuel system', label: 'Tank inside: rust, varnish, old fuel', guidance: 'Drain stale fuel; look inside with a lamp (not a flame) for rust flakes and varnish.', safety: true, cautions: ['fuel_fire'] }),
    item({ key: 'fuel-taps-lines', section: 'Fuel system', label: 'Taps, filters and fuel lines: no leaks, free flow', guidance: 'Check every joint with fuel on. Any weep is a fail.', safety: true, cautions: ['fuel_fire', 'rubber_age'] }),
    item({ key: 'carburettors', section: 'Fuel system', label: 'Carburettors cleaned: jets, floats, needle valves', guidance: 'Float levels set; float needles seal when the tap is on.', cautions: ['fuel_fire'] }),
    item({ key: 'hoses', section: 'Rubber', label: 'Coolant, breather and vacuum hoses', guidance: 'Squeeze along the length: hard, cracked or swollen rubber is replaced.', cautions: ['rubber_age'] }),
    item({ key: 'manifold-rubbers', section: 'Rubber', label: 'Inlet manifold rubbers: no cracks, clamps tight', guidance: 'A cracked rubber lets air in and the engine runs lean.', cautions: ['rubber_age'] }),
    item({ key: 'brake-fluid', section: 'Brakes', label: 'Brake fluid: type, level, condition', guidance: 'Note the fluid type on the reservoir cap. Old fluid absorbs water: replace it after storage.', safety: true, cautions: ['brake_fluid'] }),
    item({ key: 'brake-hydraulics', section: 'Brakes', label: 'Calipers, master cylinders and hoses: no seizing, no leaks', guidance: 'Pistons move freely; hoses show no cracks or bulges under pressure.', safety: true, cautions: ['brake_fluid', 'rubber_age', 'asbestos'] }),
    item({ key: 'brake-friction', section: 'Brakes', label: 'Pads, shoes and discs or drums', guidance: 'Thickness, glazing, contamination; record disc thickness where a figure is known.', kind: 'measure', unit: 'mm', safety: true, cautions: ['asbestos'] }),
    item({ key: 'tyre-age', section: 'Tyres', label: 'Tyre age from the DOT date code', guidance: 'Read the date code on each tyre (last four digits: week and year). A three-digit code means made before 2000.', kind: 'tyre_date', safety: true, cautions: ['tyre_age', 'rubber_age'] }),
    item({ key: 'tyre-condition', section: 'Tyres', label: 'Tyre condition: cracks, flat spots, tread', guidance: 'Look in the grooves and at the sidewalls for cracking; check for flat spots from standing.', safety: true, cautions: ['rubber_age'] }),
    item({ key: 'steering', section: 'Chassis', label: 'Steering head and wheel bearings', guidance: 'No play, no notchy feel, turns lock to lock freely.', safety: true }),
    item({ key: 'battery', section: 'Lights and electrics', label: 'Battery: charge, terminals, vent', guidance: 'Charge on a bench charger in moving air; clean the terminals.', cautions: ['battery'] }),
    item({ key: 'ignition', section: 'Ignition', label: 'Ignition: points or pickup, timing, plugs, leads', guidance: 'Clean or renew points and plugs; set the timing to the maker’s figure.' }),
    item({
      key: 'compression',
      section: 'Engine',
      label: 'Compression per cylinder',
      guidance: 'Warm engine, throttle open, all plugs out. The expected minimum here is a placeholder: set the maker’s figure for this engine.',
      kind: 'compression',
      unit: 'kPa',
      min: COMPRESSION_MIN_KPA_FROM_MEMORY,
    }),
    item({ key: 'throttle-sync', section: 'Engine', label: 'Throttle synchronisation (engines with more than one carburettor)', guidance: 'Balance with gauges at idle and just off idle; mark n/a for a single carburettor.' }),
    item({ key: 'lights', section: 'Lights and electrics', label: 'Lights, horn and indicators', guidance: 'Every lamp, both beams, brake light from each brake control, horn.', safety: true, cautions: ['battery'] }),
    item({ key: 'charging', section: 'Lights and electrics', label: 'Charging system output', guidance: 'Voltage at the battery rises with revs and does not run away.', cautions: ['battery'] }),
    item({ key: 'road-test', section: 'Road test', label: 'Road test', guidance: 'Brakes first at walking pace; then gears, clutch, steering, instruments. Note anything found.', safety: true, cautions: ['road_test'] }),
  ],
};

/** A pre-sale inspection of a vehicle the shop sells. */
export const preSaleTemplate: ChecklistTemplateDefinition = {
  name: 'Pre-sale inspection',
  description: 'What the shop checked before offering a vehicle for sale, to show a buyer and keep on file.',
  items: [
    item({ key: 'identity', section: 'Identity', label: 'Frame and engine numbers read and compared with the documents' }),
    item({ key: 'documents', section: 'Identity', label: 'Registration and history documents present' }),
    item({ key: 'fuel-leaks', section: 'Fuel system', label: 'No fuel leaks with the tap on', safety: true, cautions: ['fuel_fire', 'rubber_age'] }),
    item({ key: 'brakes', section: 'Brakes', label: 'Brakes: fluid, hoses, friction material, operation', safety: true, cautions: ['brake_fluid', 'asbestos'] }),
    item({ key: 'tyre-age', section: 'Tyres', label: 'Tyre age from the DOT date code', kind: 'tyre_date', safety: true, cautions: ['tyre_age'] }),
    item({ key: 'tyre-condition', section: 'Tyres', label: 'Tyre condition and pressures', safety: true, cautions: ['rubber_age'] }),
    item({ key: 'steering', section: 'Chassis', label: 'Steering, suspension and wheel bearings', safety: true }),
    item({ key: 'lights', section: 'Lights and electrics', label: 'Lights, horn and indicators', safety: true, cautions: ['battery'] }),
    item({ key: 'compression', section: 'Engine', label: 'Compression per cylinder', kind: 'compression', unit: 'kPa', min: COMPRESSION_MIN_KPA_FROM_MEMORY, guidance: 'Set the maker’s figure for this engine as the expected minimum.' }),
    item({ key: 'cosmetics', section: 'Presentation', label: 'Paint, chrome and seat: note what a buyer will see' }),
    item({ key: 'road-test', section: 'Road test', label: 'Road test', safety: true, cautions: ['road_test'] }),
  ],
};

/** Both shipped templates, in the order a new shop sees them. */
export const builtInTemplates: ChecklistTemplateDefinition[] = [recommissioningTemplate, preSaleTemplate];
