// Writes docs/roles.md from the permission rules in libs/permissions.
import { writeFileSync } from 'node:fs';
import { roleTableMarkdown } from '@tappet/permissions';

writeFileSync(new URL('../../docs/roles.md', import.meta.url), roleTableMarkdown());
console.log('docs/roles.md written.');
