import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('.', import.meta.url));

/** Path aliases for the libraries, the same as tsconfig.base.json's `paths`. */
export const libAliases = {
  '@tappet/domain': `${root}libs/domain/src/index.ts`,
  '@tappet/contracts': `${root}libs/contracts/src/index.ts`,
  '@tappet/permissions': `${root}libs/permissions/src/index.ts`,
  '@tappet/ui': `${root}libs/ui/src/index.ts`,
};
