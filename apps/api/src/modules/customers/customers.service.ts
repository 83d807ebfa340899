import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { Customer, CustomerListResponse, customerInputSchema, customerListQuerySchema, customerUpdateSchema } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { notFound } from '../../lib/http-error';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { CustomerEntity, type CustomerRow } from './customers.entity';

export type CustomerCreate = z.output<typeof customerInputSchema>;
export type CustomerPatch = z.output<typeof customerUpdateSchema>;
export type CustomerListQuery = z.output<typeof customerListQuerySchema>;

const noSuchCustomer = () => notFound('No such customer in this shop.');

/** The public view of a customer row. */
export function toCustomer(row: CustomerRow): Customer {
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    phone: row.phone,
    address: row.address,
    notes: row.notes,
    createdAt: new Date(row.createdAt).toISOString(),
    updatedAt: new Date(row.updatedAt).toISOString(),
  };
}

/**
 * A customer of the shop, looked up within the shop: another shop's id (in a URL or inside a
 * body) is "not found", never a link across shops.
 */
export async function customerInShop(manager: EntityManager, shopId: string, customerId: string): Promise<CustomerRow> {
  return shopScoped(manager, CustomerEntity, shopId).findOneOr404({ id: customerId }, 'No such customer in this shop.');
}

const likeEscape = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** Customers: minimal contact records (name, e-mail, phone, address, notes), every write audited. */
export function createCustomersService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  return {
    async list(shopId: string, query: CustomerListQuery): Promise<CustomerListResponse> {
      const qb = db.reader.createQueryBuilder(CustomerEntity, 'c').where('c.shopId = :shopId', { shopId });
      if (query.q) {
        const like = `%${likeEscape(query.q.toLowerCase())}%`;
        qb.andWhere(`(lower(c.name) LIKE :like ESCAPE '\\' OR lower(coalesce(c.email, '')) LIKE :like ESCAPE '\\' OR coalesce(c.phone, '') LIKE :like ESCAPE '\\')`, { like });
      }
      const [rows, total] = await qb
        .orderBy('lower(c.name)', 'ASC')
        .addOrderBy('c.id', 'ASC')
        .skip((query.page - 1) * query.pageSize)
        .take(query.pageSize)
        .getManyAndCount();
      return { items: rows.map(toCustomer), total, page: query.page, pageSize: query.pageSize };
    },

    async get(shopId: string, customerId: string): Promise<Customer> {
      return toCustomer(await customerInShop(db.reader, shopId, customerId));
    },

    async create(shopId: string, input: CustomerCreate, actor: AuditActor): Promise<Customer> {
      const at = clock.now();
      const row: CustomerRow = { id: randomUUID(), shopId, ...input, createdAt: at, updatedAt: at };
      await db.write(async (manager) => {
        await shopScoped(manager, CustomerEntity, shopId).insert(row);
        const changes = Object.fromEntries(Object.entries(input).flatMap(([k, v]) => (v == null ? [] : [[k, { before: null, after: v }]])));
        await recordAudit(manager, { shopId, actor, action: 'customer.created', entity: 'customer', entityId: row.id, changes, at });
      });
      return toCustomer(row);
    },

    async update(shopId: string, customerId: string, patch: CustomerPatch, actor: AuditActor): Promise<Customer> {
      return db.write(async (manager) => {
        const repo = shopScoped(manager, CustomerEntity, shopId);
        const before = await repo.findOne({ id: customerId });
        if (!before) throw noSuchCustomer();
        const changes = diffChanges(before, patch);
        if (Object.keys(changes).length === 0) return toCustomer(before);
        const at = clock.now();
        await repo.update({ id: customerId }, { ...patch, updatedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'customer.updated', entity: 'customer', entityId: customerId, changes, at });
        return toCustomer({ ...before, ...patch, updatedAt: at });
      });
    },
  };
}

export type CustomersService = ReturnType<typeof createCustomersService>;
