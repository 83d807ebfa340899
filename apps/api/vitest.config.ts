import { defineConfig } from 'vitest/config';
import { libAliases } from '../../vitest.shared.ts';

export default defineConfig({
  resolve: { alias: libAliases },
  test: {
    name: 'api',
    include: ['src/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['./src/test-support/global-setup.ts'],
    testTimeout: 20_000,
    hookTimeout: 30_000,
  },
});
