import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { answerRow, roleTableMarkdown, roleTableRows } from './role-table';

const row = (label: string) => roleTableRows.find((r) => r.label.startsWith(label))!;

describe('role table', () => {
  it('answers from the ability, including conditions', () => {
    expect(answerRow(row('Invite staff'), 'owner')).toBe('yes');
    expect(answerRow(row('Invite staff'), 'buyer')).toBe('no');
    expect(answerRow(row('Send a purchase order'), 'buyer')).toBe('conditional');
    expect(answerRow(row('Send a purchase order'), 'owner')).toBe('yes');
    expect(answerRow(row('Record checklists'), 'mechanic')).toBe('conditional');
    expect(answerRow(row('Record checklists'), 'viewer')).toBe('no');
    expect(answerRow(row('See the shop'), 'viewer')).toBe('yes');
  });

  it('docs/roles.md is the generated table (run `npm run docs:roles` after changing the rules)', () => {
    const path = fileURLToPath(new URL('../../../docs/roles.md', import.meta.url));
    expect(readFileSync(path, 'utf8')).toBe(roleTableMarkdown());
  });
});
