// Lint for the whole workspace. The module-boundary rule is what makes the project tags mean
// something: see docs/decisions/002-module-boundaries.md.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import nx from '@nx/eslint-plugin';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const frameworkImports = ['react', 'react-dom', 'react-*', '@tanstack/*', 'express', 'typeorm', 'better-sqlite3', 'multer', 'nodemailer', 'stripe', '@casl/react'];

export default tseslint.config(
  {
    ignores: ['**/node_modules/**', '**/dist/**', 'data/**', '.nx/**', 'test-results/**', 'playwright-report/**', 'coverage/**', 'tmp/**'],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { '@nx': nx },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
  {
    files: ['**/*.ts', '**/*.tsx', '**/*.mjs', '**/*.js'],
    rules: {
      '@nx/enforce-module-boundaries': [
        'error',
        {
          enforceBuildableLibDependency: false,
          allow: [],
          depConstraints: [
            { sourceTag: 'type:domain', onlyDependOnLibsWithTags: ['type:domain'], bannedExternalImports: frameworkImports },
            { sourceTag: 'type:contracts', onlyDependOnLibsWithTags: ['type:domain'], bannedExternalImports: frameworkImports },
            { sourceTag: 'type:permissions', onlyDependOnLibsWithTags: ['type:domain', 'type:contracts'], bannedExternalImports: frameworkImports },
            { sourceTag: 'type:ui', onlyDependOnLibsWithTags: ['type:ui', 'type:domain'], bannedExternalImports: ['express', 'typeorm', 'better-sqlite3'] },
            { sourceTag: 'type:web', onlyDependOnLibsWithTags: ['type:web', 'type:ui', 'type:contracts', 'type:permissions', 'type:domain'], bannedExternalImports: ['express', 'typeorm', 'better-sqlite3', 'nodemailer', 'multer'] },
            { sourceTag: 'type:api', onlyDependOnLibsWithTags: ['type:api', 'type:contracts', 'type:permissions', 'type:domain'], bannedExternalImports: ['react', 'react-dom', 'react-router-dom'] },
            { sourceTag: 'type:e2e', onlyDependOnLibsWithTags: ['type:e2e', 'type:contracts', 'type:permissions', 'type:domain'] },
            { sourceTag: 'type:tools', onlyDependOnLibsWithTags: ['type:tools', 'type:api', 'type:contracts', 'type:permissions', 'type:domain'] },
            { sourceTag: 'type:seeds', onlyDependOnLibsWithTags: ['type:seeds', 'type:api', 'type:contracts', 'type:permissions', 'type:domain'] },
          ],
        },
      ],
    },
  },
  {
    // Build and test configuration files sit in a project's folder but belong to the workspace:
    // they read the shared alias list at the root.
    files: ['**/vite.config.ts', '**/vitest.config.ts', '**/playwright.config.ts'],
    rules: { '@nx/enforce-module-boundaries': 'off' },
  },
  {
    files: ['apps/web/**/*.tsx', 'apps/web/**/*.ts', 'libs/ui/**/*.tsx', 'libs/ui/**/*.ts'],
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
  {
    files: ['**/*.test.ts', '**/*.test.tsx', '**/*.spec.ts', '**/__tests__/**'],
    rules: { '@typescript-eslint/no-non-null-assertion': 'off' },
  },
);
