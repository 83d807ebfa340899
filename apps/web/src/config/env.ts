// Checked by hand rather than with zod: this module is in the first download, and zod is not
// (docs/decisions/022-first-load.md).

/** Validates the build-time environment; a bad value stops the app with every problem listed. */
export function parseEnv(source: Record<string, unknown>) {
  const problems: string[] = [];
  const text = (key: string, fallback: string): string => {
    const value = source[key];
    if (value === undefined) return fallback;
    if (typeof value === 'string') return value;
    problems.push(`${key}: expected a string`);
    return fallback;
  };
  /** Where the API lives, as a same-origin path: session cookies are same-origin only. */
  const apiBaseUrl = text('VITE_API_BASE_URL', '/api');
  if (!/^\/[A-Za-z0-9/_-]*$/.test(apiBaseUrl)) problems.push('VITE_API_BASE_URL: VITE_API_BASE_URL must be a same-origin path such as /api.');
  const mode = text('MODE', 'production');
  if (problems.length > 0) throw new Error(`Invalid web app configuration:\n${problems.join('\n')}`);
  return { apiBaseUrl: apiBaseUrl.replace(/\/$/, ''), mode };
}

export const env = parseEnv(import.meta.env);
