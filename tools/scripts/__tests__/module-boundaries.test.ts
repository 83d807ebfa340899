// Proves the project tags are enforced, not decoration: the boundary rule must flag imports that
// conventions.md forbids. (Without a project graph the Nx rule silently skips, so we build it first.)
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../../', import.meta.url));
let eslint: ESLint;

beforeAll(() => {
  execFileSync('npx', ['nx', 'show', 'projects'], { cwd: root, env: { ...process.env, NX_DAEMON: 'false' }, stdio: 'ignore' });
  eslint = new ESLint({ cwd: root });
}, 60_000);

async function boundaryErrors(filePath: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath: `${root}${filePath}` });
  return (result?.messages ?? []).filter((m) => m.ruleId === '@nx/enforce-module-boundaries').map((m) => m.message);
}

describe('module boundaries', () => {
  it('refuses React inside libs/domain', async () => {
    const errors = await boundaryErrors('libs/domain/src/probe.ts', "import { useState } from 'react';\nexport const x = useState;\n");
    expect(errors.join('\n')).toMatch(/react/i);
  });

  it('refuses TypeORM inside libs/permissions', async () => {
    const errors = await boundaryErrors('libs/permissions/src/probe.ts', "import { DataSource } from 'typeorm';\nexport const x = DataSource;\n");
    expect(errors.length).toBeGreaterThan(0);
  });

  it('refuses libs/domain importing libs/contracts', async () => {
    const errors = await boundaryErrors('libs/domain/src/probe.ts', "import { shopRoles } from '@tappet/contracts';\nexport const x = shopRoles;\n");
    expect(errors.length).toBeGreaterThan(0);
  });

  it('refuses the web app importing the API', async () => {
    const errors = await boundaryErrors('apps/web/src/probe.ts', "import { x } from '../../api/src/probe';\nexport const y = x;\n");
    expect(errors.length).toBeGreaterThan(0);
  });

  it('allows the API to use contracts and permissions', async () => {
    const errors = await boundaryErrors(
      'apps/api/src/probe.ts',
      "import { shopRoles } from '@tappet/contracts';\nimport { defineAbilityFor } from '@tappet/permissions';\nexport const x = [shopRoles, defineAbilityFor];\n",
    );
    expect(errors).toEqual([]);
  });
});
