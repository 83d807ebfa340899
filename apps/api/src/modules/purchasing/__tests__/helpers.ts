import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { expect } from 'vitest';
import { csrf } from '../../../test-support/test-app';

export type Agent = TestAgent<Test>;

/** Posts to a shop's purchasing API and expects `status`; returns the body. */
export async function post(agent: Agent, shopId: string, path: string, body: object, status = 200) {
  const res = await agent.post(`/api/shops/${shopId}/purchasing${path}`).set(csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body;
}

/** Adds a part through the catalogue API and returns its id. */
export async function addPart(agent: Agent, shopId: string, number: string, extra: Record<string, unknown> = {}): Promise<string> {
  const res = await agent.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number, description: `Part ${number}`, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/** Adds a bin through the stock API and returns its id. */
export async function addBin(agent: Agent, shopId: string, code: string): Promise<string> {
  const res = await agent.post(`/api/shops/${shopId}/stock/bins`).set(csrf).send({ code });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/** Adds a supplier and returns its id. */
export async function addSupplier(agent: Agent, shopId: string, extra: Record<string, unknown> = {}): Promise<string> {
  const body = await post(agent, shopId, '/suppliers', { name: `Supplier ${Math.random().toString(36).slice(2, 8)}`, email: 'orders@marrick-spares.test', currency: 'GBP', leadTimeDays: 7, ...extra }, 201);
  return body.id as string;
}
