import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import { libAliases } from '../../vitest.shared.ts';

export default defineConfig({
  plugins: [react()],
  resolve: { alias: libAliases },
  test: { name: 'ui', include: ['src/**/*.test.{ts,tsx}'], environment: 'jsdom', passWithNoTests: true },
});
