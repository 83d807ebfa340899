import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import { libAliases } from '../../vitest.shared.ts';

export default defineConfig({
  plugins: [react()],
  resolve: { alias: libAliases },
  test: {
    name: 'web',
    include: ['src/**/*.test.{ts,tsx}'],
    environment: 'jsdom',
    setupFiles: ['./src/test-setup.ts'],
  },
});
