import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { migrations } from '../data-source';
import { postgresMigrations } from '../migrations/postgres';

const timestampOf = (name: string) => /(\d{13})$/.exec(name)?.[1];
const nameOf = (migration: new () => { name?: string }) => new migration().name ?? '';
const filesIn = (dir: string) => fs.readdirSync(dir).filter((f) => /^\d{13}-.*\.ts$/.test(f)).sort();

describe('migrations for both databases', () => {
  it('lists a PostgreSQL twin for every SQLite migration, with the same name, in the same order', () => {
    const sqlite = migrations.map(nameOf);
    const postgres = postgresMigrations.map(nameOf);
    expect(postgres).toEqual(sqlite);
    expect(sqlite.map(timestampOf)).toEqual([...sqlite.map(timestampOf)].sort());
    expect(sqlite.every((n) => timestampOf(n) !== undefined)).toBe(true);
    expect(postgresMigrations.map((m) => m.name)).toEqual(migrations.map((m) => `${m.name}Pg`));
  });

  it('has a twin file for every migration file, and every file is in a list', () => {
    const dir = path.join(__dirname, '..', 'migrations');
    const sqliteFiles = filesIn(dir);
    expect(filesIn(path.join(dir, 'postgres'))).toEqual(sqliteFiles);
    expect(sqliteFiles.map((f) => f.slice(0, 13))).toEqual(migrations.map((m) => timestampOf(nameOf(m))));
  });
});
