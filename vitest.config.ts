import { defineConfig } from 'vitest/config';

// One Vitest run, several projects. Each project's own config lives beside it.
export default defineConfig({
  test: {
    projects: ['libs/*/vitest.config.ts', 'apps/*/vitest.config.ts', 'tools/vitest.config.ts'],
  },
});
