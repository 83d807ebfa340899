import { z } from 'zod';

const envSchema = z.object({
  /** Where the API lives, as a same-origin path: session cookies are same-origin only. */
  VITE_API_BASE_URL: z
    .string()
    .regex(/^\/[A-Za-z0-9/_-]*$/, 'VITE_API_BASE_URL must be a same-origin path such as /api.')
    .default('/api'),
  MODE: z.string().default('production'),
});

/** Validates the build-time environment; a bad value stops the app with every problem listed. */
export function parseEnv(source: Record<string, unknown>) {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const problems = result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid web app configuration:\n${problems}`);
  }
  return {
    apiBaseUrl: result.data.VITE_API_BASE_URL.replace(/\/$/, ''),
    mode: result.data.MODE,
  };
}

export const env = parseEnv(import.meta.env);
