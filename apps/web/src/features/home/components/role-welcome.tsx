import { roleLabels, type ShopRole } from '@tappet/contracts';
import { Badge, Num } from '@tappet/ui';
import type { MembershipView } from '../../../lib/auth';
import { formatDateTime } from '../../../lib/dates';

const roleDuty: Record<ShopRole, string> = {
  owner: 'You run this shop: its name and settings, its staff and their roles, and its billing are yours to manage.',
  mechanic: 'You look up parts, take them from stock for the jobs assigned to you, and record checklists and labour on those jobs.',
  buyer: 'You look after suppliers, the reorder list and purchase orders, and you receive deliveries.',
  viewer: 'You can read the shop’s records but not change them.',
};

/** Where each role starts its day, by the names of the menu's entries. */
const roleStarts: Record<ShopRole, string[]> = {
  owner: [
    'Find any part number, old or new, under Lookup.',
    'Follow every vehicle and job under Vehicles and Jobs.',
    'Invoice customers and record payments under Sales; see how the shop is doing under Sales reports.',
    'Keep the shop’s settings, staff and billing under Shop, Staff and Billing.',
  ],
  mechanic: [
    'Find parts under Lookup: type what is stamped on the part, or scan a label.',
    'Your jobs are under Jobs: record checklists, readings, parts and labour there.',
  ],
  buyer: ['Work through the reorder list and receive deliveries under Purchasing.', 'Count stock, bin by bin, under Counts.'],
  viewer: ['Look anything up under Lookup, Stock, Vehicles and Jobs.'],
};

const amountFormat = new Intl.NumberFormat(undefined, { minimumFractionDigits: 2, maximumFractionDigits: 2 });

export interface RoleWelcomeProps {
  firstName: string;
  membership: MembershipView;
  /** How many shops the person belongs to (the switcher matters only with more than one). */
  shopCount: number;
}

/**
 * What this person is in this shop and what they can do here today. It lists only things that
 * exist now: screens still to come are not shown as links.
 */
export function RoleWelcome({ firstName, membership, shopCount }: RoleWelcomeProps) {
  const { role } = membership;
  const support = membership.supportUntil != null;
  const now: string[] = support ? ['Look things up and correct records where the owner asked for help.'] : [...roleStarts[role]];
  if (shopCount > 1 && !support) now.push('Move between your shops with “Switch shop” at the top of the page.');
  now.push('Choose a light or dark theme for this device with “Theme” at the foot of the menu.');

  return (
    <section aria-labelledby="welcome-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="welcome-title" className="text-lg font-bold">
          Welcome, {firstName}
        </h2>
        <Badge tone="accent">
          <span className="sr-only">Your role: </span>
          {support ? 'Support access' : roleLabels[role]}
        </Badge>
      </div>
      <p>
        {support ? (
          <>
            You are here under the owner’s support grant, until <time dateTime={membership.supportUntil!}>{formatDateTime((membership.supportUntil!))}</time>. Staff, API keys,
            billing and support access stay with the shop.
          </>
        ) : (
          roleDuty[role]
        )}
      </p>
      {role === 'buyer' && (
        <p>
          {membership.spendingLimitMinor === null ? (
            'No spending limit is set for you yet, so the owner approves your purchase orders.'
          ) : (
            <>
              Your spending limit per purchase order:{' '}
              <Num className="font-bold">{amountFormat.format(membership.spendingLimitMinor / 100)}</Num> in the shop’s
              currency. Orders above it go to the owner for approval.
            </>
          )}
        </p>
      )}
      <div>
        <h3 className="font-bold">What you can do here today</h3>
        <ul className="mt-1 list-disc pl-6">
          {now.map((item) => (
            <li key={item}>{item}</li>
          ))}
        </ul>
      </div>
    </section>
  );
}
