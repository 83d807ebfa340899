// Runs the fake Stripe API on its own: `tsx tools/fake-stripe/cli.ts`.
// FAKE_STRIPE_PORT (12111), FAKE_STRIPE_HOST (127.0.0.1), FAKE_STRIPE_PUBLIC_URL (the listen address),
// STRIPE_WEBHOOK_URL (http://127.0.0.1:3000/api/billing/webhook; empty to record events only),
// STRIPE_WEBHOOK_SECRET (whsec_local_demo_only), FAKE_STRIPE_CATALOGUE (path to a JSON catalogue).
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { type Catalogue, catalogueSchema, startFakeStripe } from './server.ts';

const env = z
  .object({
    FAKE_STRIPE_PORT: z.coerce.number().int().min(0).max(65_535).default(12_111),
    FAKE_STRIPE_HOST: z.string().min(1).default('127.0.0.1'),
    FAKE_STRIPE_PUBLIC_URL: z.url().optional(),
    STRIPE_WEBHOOK_URL: z.union([z.url(), z.literal('')]).default('http://127.0.0.1:3000/api/billing/webhook'),
    STRIPE_WEBHOOK_SECRET: z.string().startsWith('whsec_').default('whsec_local_demo_only'),
    FAKE_STRIPE_CATALOGUE: z.string().min(1).optional(),
  })
  .safeParse(process.env);

if (!env.success) {
  console.error('fake-stripe: invalid settings:\n' + env.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n'));
  process.exit(1);
}
const settings = env.data;

let catalogue: Catalogue | undefined;
if (settings.FAKE_STRIPE_CATALOGUE) {
  const parsed = catalogueSchema.safeParse(JSON.parse(readFileSync(settings.FAKE_STRIPE_CATALOGUE, 'utf8')));
  if (!parsed.success) {
    console.error(`fake-stripe: ${settings.FAKE_STRIPE_CATALOGUE} is not a valid catalogue: ${parsed.error.message}`);
    process.exit(1);
  }
  catalogue = parsed.data;
}

const fake = await startFakeStripe({
  port: settings.FAKE_STRIPE_PORT,
  host: settings.FAKE_STRIPE_HOST,
  webhookUrl: settings.STRIPE_WEBHOOK_URL || null,
  webhookSecret: settings.STRIPE_WEBHOOK_SECRET,
  publicUrl: settings.FAKE_STRIPE_PUBLIC_URL,
  catalogue,
});
console.log(`Fake Stripe (local test stand-in) listening on ${fake.url}; webhooks to ${settings.STRIPE_WEBHOOK_URL || '(none, recorded only)'}`);

const stop = () => {
  fake.close().then(
    () => process.exit(0),
    () => process.exit(1),
  );
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
