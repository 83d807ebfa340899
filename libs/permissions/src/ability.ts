import { AbilityBuilder, createMongoAbility, type ForcedSubject, type MongoAbility, type MongoQuery, subject as asSubject } from '@casl/ability';
import type { ShopRole } from '@tappet/contracts';

/**
 * Actions. The CRUD four plus the trade's own verbs, so a rule can say "a mechanic may issue
 * stock" without also letting them adjust it.
 */
export const actions = [
  'manage',
  'read',
  'create',
  'update',
  'delete',
  'import',
  'export',
  'hold',
  'issue',
  'receive',
  'adjust',
  'move',
  'count',
  'approve',
  'send',
  'signOff',
] as const;
export type Action = (typeof actions)[number];

/** Subjects: one per kind of record a rule can be about. */
export const subjects = [
  'Shop',
  'Settings',
  'Staff',
  'ApiKey',
  'AuditLog',
  'Billing',
  'ShopExport',
  'Part',
  'Stock',
  'Bin',
  'StockCount',
  'Supplier',
  'PurchaseOrder',
  'Vehicle',
  'Job',
  'Customer',
  'Invoice',
  // Payments received against invoices (sales, issue 12).
  'Payment',
  // Estimates for customers' jobs, consignment terms and settlements, sales reports (issue 12).
  'Estimate',
  'Consignment',
  'SalesReport',
  'Platform',
  'SupportAccess',
] as const;
export type SubjectName = (typeof subjects)[number];

/** Everything that lives inside one shop (all subjects but the platform itself). */
export const shopSubjects: SubjectName[] = subjects.filter((s) => s !== 'Platform');

/** A record as CASL sees it: its type name plus the attributes rules look at. */
export interface SubjectRecord {
  shopId?: string;
  assigneeIds?: string[];
  totalMinor?: number;
  userId?: string;
  [key: string]: unknown;
}

/** A record tagged with its subject type (see `subjectOf`). */
export type TaggedSubject = ForcedSubject<SubjectName> & SubjectRecord;

export type AppAbility = MongoAbility<[Action, SubjectName | 'all' | TaggedSubject]>;

/** Who is acting: a signed-in person, or an API key acting with a role. */
export interface Actor {
  userId: string;
  isPlatformAdmin: boolean;
  /** Set when the request is authenticated by an API key instead of a session. */
  apiKeyId?: string | null;
}

/** The actor's standing in the shop the request is about. */
export interface ShopContext {
  shopId: string;
  role: ShopRole;
  /** Purchase orders up to this total (minor units) may be sent without approval; null = none set. */
  spendingLimitMinor: number | null;
  /** False when the shop is suspended or cancelled: everything becomes read-only but the export. */
  writable?: boolean;
  /** True while a platform admin acts under a support-access grant. */
  viaSupportGrant?: boolean;
}

/** Actions that change data; a read-only shop refuses them all. */
// 'manage' is CASL's wildcard for every action, so it is left out here on purpose.
export const writeActions: Action[] = actions.filter((a) => a !== 'read' && a !== 'export' && a !== 'manage');

/** API keys can hold at most these roles. */
export const apiKeyRoles: ShopRole[] = ['viewer', 'buyer'];

/**
 * Builds the ability of one actor in one shop (or on the platform when `shop` is null).
 * This is the only definition of who may do what: the API enforces it and the web app hides
 * what it refuses.
 */
export function defineAbilityFor(actor: Actor, shop: ShopContext | null): AppAbility {
  const { can, cannot, build } = new AbilityBuilder<AppAbility>(createMongoAbility);

  if (actor.isPlatformAdmin && !actor.apiKeyId) {
    can('manage', 'Platform');
  }

  if (shop) {
    const own = { shopId: shop.shopId };
    // Everyone in the shop reads the shop's working data, and its settings (currency, units, rates
    // that every screen needs to show figures); changing settings stays with the owner.
    for (const s of ['Shop', 'Settings', 'Part', 'Stock', 'Bin', 'StockCount', 'Supplier', 'PurchaseOrder', 'Vehicle', 'Job', 'Customer', 'Invoice', 'Payment'] as const) {
      can('read', s, own);
    }

    // Buyers and viewers read estimates, consignments and sales reports, but not the margins in them.
    if (shop.role === 'buyer' || shop.role === 'viewer') {
      can('read', ['Estimate', 'Consignment', 'SalesReport'], own);
      cannot('read', 'SalesReport', ['margin']).because('Only the owner sees gross margins.');
    }

    switch (shop.role) {
      case 'owner':
        can('manage', shopSubjects, own);
        break;
      case 'mechanic':
        can('hold', 'Stock', own);
        can('issue', 'Stock', own);
        // Stock counts: everyone on the floor may enter what they counted; posting stays with the owner.
        can('count', 'StockCount', own);
        can('update', 'Vehicle', own);
        can('create', 'Vehicle', own);
        // Field-level: what the shop paid for a vehicle and asks for it are the owner's call.
        cannot('update', 'Vehicle', ['acquisitionCostMinor', 'askingPriceMinor']).because('Only the owner sets a vehicle’s acquisition cost and asking price.');
        // What the shop paid for a vehicle and what it makes on it are not the workshop floor's to see.
        cannot('read', 'Vehicle', ['acquisitionCostMinor', 'margin']).because('Only the owner sees what a vehicle cost the shop and its margin.');
        // Jobs: only those the mechanic is assigned to.
        can(['update', 'hold', 'issue'], 'Job', where({ ...own, assigneeIds: actor.userId }));
        // Estimates: only those of the jobs the mechanic is assigned to; no consignment or sales figures.
        can('read', 'Estimate', where({ ...own, assigneeIds: actor.userId }));
        // Sales (issue 12): a mechanic sees sell prices but not what parts cost the shop or its margin.
        cannot('read', 'Part', ['unitCostMinor', 'margin']).because('Only the owner, buyers and viewers see what a part cost the shop and its margin.');
        cannot('read', 'Invoice', ['unitCostMinor', 'margin']).because('Only the owner, buyers and viewers see what a sale cost the shop and its margin.');
        break;
      case 'buyer':
        can(['create', 'update', 'import'], 'Part', own);
        can(['create', 'update', 'delete', 'import'], 'Supplier', own);
        can(['receive', 'move'], 'Stock', own);
        can(['create', 'update'], 'Bin', own);
        // Stock counts: start (create), enter (count) and abandon (update); posting is the owner's.
        can(['create', 'count', 'update'], 'StockCount', own);
        can(['create', 'update'], 'PurchaseOrder', own);
        // Sending an order within the limit needs no approval; above it goes to the owner.
        if (shop.spendingLimitMinor !== null) {
          can('send', 'PurchaseOrder', where({ ...own, totalMinor: { $lte: shop.spendingLimitMinor } }));
        }
        break;
      case 'viewer':
        break;
    }

    if (actor.apiKeyId) {
      // Keys never administer the shop, whatever role they carry.
      cannot('manage', ['Staff', 'ApiKey', 'Billing', 'Settings', 'SupportAccess', 'AuditLog', 'ShopExport']);
    }
    if (shop.viaSupportGrant) {
      // Support helps; it does not change who runs the shop or how it pays.
      cannot('manage', ['Staff', 'ApiKey', 'Billing', 'SupportAccess']);
    }
    if (shop.writable === false) {
      // Paying again and asking support for help stay open: they are how a shop gets back to writing.
      const locked = subjects.filter((s) => s !== 'Billing' && s !== 'SupportAccess');
      cannot(writeActions, locked).because('This shop is read-only while its subscription is suspended or cancelled.');
    }
  }

  return build();
}

/**
 * Conditions on record attributes. Our subjects are named by string, so CASL cannot type their
 * fields; the attribute names are checked by the tests instead.
 */
function where(conditions: Record<string, unknown>): MongoQuery<never> {
  return conditions as MongoQuery<never>;
}

/** Tags a plain record with its subject type so conditions apply to it. */
export function subjectOf(type: SubjectName, record: SubjectRecord): TaggedSubject {
  return asSubject(type, { ...record }) as TaggedSubject;
}
