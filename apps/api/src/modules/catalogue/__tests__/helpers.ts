import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { expect } from 'vitest';
import { csrf } from '../../../test-support/test-app';

export type Agent = TestAgent<Test>;

/** Adds a part through the API and returns its id. */
export async function addPart(agent: Agent, shopId: string, number: string, extra: Record<string, unknown> = {}): Promise<string> {
  const res = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number, description: `Part ${number}`, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/** Links two parts through the API and returns the link id. */
export async function addLink(agent: Agent, shopId: string, body: Record<string, unknown>): Promise<string> {
  const res = await agent.post(`/api/shops/${shopId}/part-links`).set(csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/** Posts a CSV import. */
export function importCsv(agent: Agent, shopId: string, kind: string, mode: string, content: string | Buffer, name = `${kind}.csv`) {
  return agent
    .post(`/api/shops/${shopId}/imports`)
    .set(csrf)
    .field('kind', kind)
    .field('mode', mode)
    .attach('file', typeof content === 'string' ? Buffer.from(content, 'utf8') : content, name);
}
