import { defineConfig } from 'vitest/config';
import { libAliases } from '../../vitest.shared.ts';

export default defineConfig({
  resolve: { alias: libAliases },
  test: { name: 'contracts', include: ['src/**/*.test.ts'], environment: 'node' },
});
