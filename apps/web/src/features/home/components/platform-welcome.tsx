/** The platform administrator's home: honest about what there is, and about what they cannot see. */
export function PlatformWelcome({ firstName, hasShops }: { firstName: string; hasShops: boolean }) {
  return (
    <section aria-labelledby="platform-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
      <h2 id="platform-title" className="text-lg font-bold">
        Welcome, {firstName}
      </h2>
      <p>
        You are a platform administrator. You look after the shops that use Tappet: onboarding, plans and subscriptions.
      </p>
      <p>
        {hasShops
          ? 'You also belong to one or more shops; switch to one with “Switch shop” at the top to work in it.'
          : 'You do not belong to any shop, so no shop’s parts, stock or customers are shown to you. A shop’s owner can grant you time-limited support access when they need help.'}
      </p>
      <p className="text-ink-muted">The administration screens will appear in the menu as they are switched on.</p>
    </section>
  );
}

/** Someone signed in who belongs to no shop (for example, removed from their only shop). */
export function NoShopWelcome({ firstName }: { firstName: string }) {
  return (
    <section aria-labelledby="no-shop-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
      <h2 id="no-shop-title" className="text-lg font-bold">
        Welcome, {firstName}
      </h2>
      <p>You are signed in, but you are not a member of any shop at the moment.</p>
      <p>Ask the owner of your shop to invite you again; the shop appears here as soon as they do.</p>
    </section>
  );
}
