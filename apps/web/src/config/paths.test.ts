import { describe, expect, it } from 'vitest';
import { parseEnv } from './env';
import { paths, safeRedirect } from './paths';

describe('safeRedirect', () => {
  it('allows same-origin paths', () => {
    expect(safeRedirect('/shops/abc/shop?tab=1')).toBe('/shops/abc/shop?tab=1');
  });
  it.each(['//evil.test/x', 'https://evil.test', '/\\evil.test', 'javascript:alert(1)', '', null, undefined])('refuses %s', (target) => {
    expect(safeRedirect(target, '/home')).toBe('/home');
  });
  it('does not loop back to the sign-in page', () => {
    expect(safeRedirect('/sign-in?redirectTo=%2F', '/home')).toBe('/home');
  });
});

describe('paths', () => {
  it('builds shop URLs and a sign-in link that returns to where the person was', () => {
    expect(paths.shop.settings.getHref('abc')).toBe('/shops/abc/shop');
    expect(paths.auth.signIn.getHref('/shops/abc')).toBe('/sign-in?redirectTo=%2Fshops%2Fabc');
    expect(paths.auth.signIn.getHref('/')).toBe('/sign-in');
  });
});

describe('parseEnv', () => {
  it('defaults the API to /api', () => {
    expect(parseEnv({}).apiBaseUrl).toBe('/api');
  });
  it('refuses an API on another origin, naming the variable', () => {
    expect(() => parseEnv({ VITE_API_BASE_URL: 'https://api.elsewhere.test' })).toThrow(/VITE_API_BASE_URL/);
  });
});
