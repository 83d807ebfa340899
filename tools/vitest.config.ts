import { defineConfig } from 'vitest/config';
import { libAliases } from '../vitest.shared.ts';

export default defineConfig({
  resolve: { alias: libAliases },
  test: { name: 'tools', include: ['**/*.test.ts'], exclude: ['**/node_modules/**'], environment: 'node', passWithNoTests: true },
});
