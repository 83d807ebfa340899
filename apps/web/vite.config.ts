import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';
import { libAliases } from '../../vitest.shared.ts';

const here = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = fileURLToPath(new URL('../../', import.meta.url));
const apiOrigin = process.env.TAPPET_API_ORIGIN ?? 'http://localhost:3000';

// The API serves the built app from dist/apps/web and the fonts from fonts/; in development Vite
// serves the app and hands /api and /fonts to the API, so cookies stay same-origin.
export default defineConfig({
  root: here,
  plugins: [react(), tailwindcss()],
  resolve: { alias: libAliases },
  build: {
    outDir: `${repoRoot}dist/apps/web`,
    emptyOutDir: true,
    sourcemap: true,
    target: 'es2022',
    rolldownOptions: {
      treeshake: {
        // The workspace libraries are plain modules without import-time effects (CSS aside).
        // Saying so lets a screen's chunk keep what only it uses (e.g. the DataTable and
        // TanStack Table) instead of everything the UI library's index re-exports landing in
        // the first download. `undefined` keeps the default for everything else.
        moduleSideEffects: (id: string) => (/\/libs\/(ui|contracts|permissions|domain)\/src\/.*\.tsx?$/.test(id) ? false : undefined),
      },
    },
  },
  server: {
    port: 5173,
    proxy: {
      '/api': { target: apiOrigin, changeOrigin: false },
      '/fonts': { target: apiOrigin, changeOrigin: false },
    },
  },
  preview: {
    proxy: {
      '/api': { target: apiOrigin, changeOrigin: false },
      '/fonts': { target: apiOrigin, changeOrigin: false },
    },
  },
});
