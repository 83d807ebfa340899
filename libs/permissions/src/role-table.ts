import type { ShopRole } from '@tappet/contracts';
import { shopRoles, roleLabels } from '@tappet/contracts';
import { defineAbilityFor, subjectOf, type Action, type SubjectName, type SubjectRecord } from './ability';

/** One line of the role table: a thing a person may want to do, and the record it is done to. */
export interface RoleTableRow {
  label: string;
  action: Action;
  subject: SubjectName;
  /** Extra attributes of the record besides its shop (e.g. a job's assignees). */
  record?: (me: string) => SubjectRecord;
  /** Words for the condition when a role may do it only on some records. */
  condition?: string;
  /** A single field of the record, for field-level rules. */
  field?: string;
}

export type RoleTableAnswer = 'yes' | 'no' | 'conditional';

/**
 * The rows shown in docs/roles.md. Each is answered by the ability itself, so the document
 * cannot drift from the rules the API enforces.
 */
export const roleTableRows: RoleTableRow[] = [
  { label: 'See the shop and its working data', action: 'read', subject: 'Part' },
  { label: 'Rename the shop', action: 'update', subject: 'Shop' },
  { label: 'Read the shop settings (currency, units, rates)', action: 'read', subject: 'Settings' },
  { label: 'Change the shop settings', action: 'update', subject: 'Settings' },
  { label: 'Invite staff, change roles and limits', action: 'create', subject: 'Staff' },
  { label: 'Create and revoke API keys', action: 'create', subject: 'ApiKey' },
  { label: 'Read the audit log', action: 'read', subject: 'AuditLog' },
  { label: 'Manage billing', action: 'update', subject: 'Billing' },
  { label: 'Export the whole shop', action: 'export', subject: 'ShopExport' },
  { label: 'Create and edit parts, links and fitments', action: 'update', subject: 'Part' },
  { label: 'Import catalogue files', action: 'import', subject: 'Part' },
  { label: 'Hold stock', action: 'hold', subject: 'Stock' },
  { label: 'Issue stock', action: 'issue', subject: 'Stock' },
  { label: 'Receive stock', action: 'receive', subject: 'Stock' },
  { label: 'Adjust stock', action: 'adjust', subject: 'Stock' },
  { label: 'Start or abandon a stock count', action: 'create', subject: 'StockCount' },
  { label: 'Enter counted quantities', action: 'count', subject: 'StockCount' },
  { label: 'Post a stock count (its variances become movements)', action: 'approve', subject: 'StockCount' },
  { label: 'Keep suppliers', action: 'update', subject: 'Supplier' },
  { label: 'Draft purchase orders', action: 'create', subject: 'PurchaseOrder' },
  {
    label: 'Send a purchase order',
    action: 'send',
    subject: 'PurchaseOrder',
    record: () => ({ totalMinor: 1 }),
    condition: 'within their spending limit; above it the owner approves',
  },
  { label: 'Approve a purchase order', action: 'approve', subject: 'PurchaseOrder' },
  { label: 'Create and edit vehicles', action: 'update', subject: 'Vehicle' },
  { label: 'Set a vehicle’s acquisition cost and asking price', action: 'update', subject: 'Vehicle', field: 'askingPriceMinor' },
  { label: 'See a vehicle’s total cost and margin', action: 'read', subject: 'Vehicle', field: 'margin' },
  {
    label: 'Record checklists, parts and labour on a job',
    action: 'update',
    subject: 'Job',
    record: (me) => ({ assigneeIds: [me] }),
    condition: 'only on jobs assigned to them',
  },
  { label: 'Read invoices, credit notes and payments', action: 'read', subject: 'Invoice' },
  { label: 'Draft and issue invoices and credit notes, set line prices', action: 'issue', subject: 'Invoice' },
  { label: 'Record payments (cash, bank transfer) and take card payments', action: 'create', subject: 'Payment' },
  { label: 'See what parts cost and the margin on sales', action: 'read', subject: 'Part', field: 'margin' },
  { label: 'Set pricing rules, list prices and tax rates', action: 'update', subject: 'Settings' },
  {
    label: 'See estimates for customers',
    action: 'read',
    subject: 'Estimate',
    record: (me) => ({ assigneeIds: [me] }),
    condition: 'only those of jobs assigned to them',
  },
  { label: 'Write and send estimates', action: 'send', subject: 'Estimate' },
  { label: 'See consignment terms and settlements', action: 'read', subject: 'Consignment' },
  { label: 'Agree consignment terms, settle and record payouts', action: 'create', subject: 'Consignment' },
  { label: 'See sales reports (sales by period, unpaid invoices)', action: 'read', subject: 'SalesReport' },
  { label: 'See gross margins in sales reports', action: 'read', subject: 'SalesReport', field: 'margin' },
];

const sampleShop = '00000000-0000-4000-8000-000000000001';
const me = '00000000-0000-4000-8000-0000000000aa';
const someoneElse = '00000000-0000-4000-8000-0000000000bb';

/** Answers one row for one role from the ability. */
export function answerRow(row: RoleTableRow, role: ShopRole): RoleTableAnswer {
  const ability = defineAbilityFor({ userId: me, isPlatformAdmin: false }, { shopId: sampleShop, role, spendingLimitMinor: 100 });
  const extra = row.record?.(me) ?? {};
  const allowed = ability.can(row.action, subjectOf(row.subject, { shopId: sampleShop, ...extra }), row.field);
  if (!allowed) return 'no';
  // Conditional when the same record without the favourable attributes would be refused.
  if (row.record) {
    const worse = { ...extra };
    if ('assigneeIds' in worse) worse.assigneeIds = [someoneElse];
    if ('totalMinor' in worse) worse.totalMinor = Number.MAX_SAFE_INTEGER;
    if (!ability.can(row.action, subjectOf(row.subject, { shopId: sampleShop, ...worse }))) return 'conditional';
  }
  return 'yes';
}

/** The role table as Markdown (docs/roles.md is this text; a test keeps them equal). */
export function roleTableMarkdown(): string {
  const head = `| what | ${shopRoles.map((r) => roleLabels[r].toLowerCase()).join(' | ')} |`;
  const sep = `| --- | ${shopRoles.map(() => ':---:').join(' | ')} |`;
  const lines = roleTableRows.map((row) => {
    const cells = shopRoles.map((role) => {
      const a = answerRow(row, role);
      return a === 'yes' ? 'yes' : a === 'no' ? '—' : `yes, ${row.condition ?? 'on some records'}`;
    });
    return `| ${row.label} | ${cells.join(' | ')} |`;
  });
  return [
    '# Who may do what',
    '',
    '<!-- Generated by `npm run docs:roles` from libs/permissions; do not edit by hand. A test fails when it is out of date. -->',
    '',
    'Every role acts only inside the shops it belongs to; another shop\'s records answer "not found".',
    'Platform admins run the platform (shops, plans, subscriptions) and see no shop data unless the',
    'shop\'s owner grants time-boxed support access. API keys act as a viewer or a buyer and never',
    'manage staff, keys, billing or settings. A suspended or cancelled shop is read-only for everyone',
    '(the export still works).',
    '',
    head,
    sep,
    ...lines,
    '',
  ].join('\n');
}
