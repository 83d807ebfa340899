import type { EntityManager, EntitySchema, FindOptionsOrder, FindOptionsWhere, ObjectLiteral } from 'typeorm';
import { notFound } from '../lib/http-error';

/** Rows of shop-owned tables carry their shop's id. */
export interface ShopOwned extends ObjectLiteral {
  shopId: string;
}

/**
 * Repository helpers for a shop-owned table that cannot be called without the tenant: every
 * query is filtered by `shopId`, and inserts are stamped with it. Use it for every shop-owned read
 * and write so another shop's id can only ever produce "not found".
 */
export function shopScoped<T extends ShopOwned>(manager: EntityManager, schema: EntitySchema<T>, shopId: string) {
  const repo = manager.getRepository(schema);
  const scoped = (where: FindOptionsWhere<T> = {}) => ({ ...where, shopId }) as FindOptionsWhere<T>;
  return {
    find: (where?: FindOptionsWhere<T>, order?: FindOptionsOrder<T>, take?: number) => repo.find({ where: scoped(where), order, take }),
    findOne: (where: FindOptionsWhere<T>) => repo.findOne({ where: scoped(where) }),
    /** Like findOne, but a missing (or foreign) row is a 404 with `message`. */
    async findOneOr404(where: FindOptionsWhere<T>, message = 'Not found.'): Promise<T> {
      const row = await repo.findOne({ where: scoped(where) });
      if (!row) throw notFound(message);
      return row;
    },
    count: (where?: FindOptionsWhere<T>) => repo.count({ where: scoped(where) }),
    /** Inserts rows stamped with this shop's id, whatever they say. */
    insert: (rows: Omit<T, 'shopId'> | Array<Omit<T, 'shopId'>>) => {
      const list = (Array.isArray(rows) ? rows : [rows]).map((r) => ({ ...r, shopId }));
      return repo.insert(list as never);
    },
    update: (where: FindOptionsWhere<T>, patch: Partial<Omit<T, 'shopId'>>) => repo.update(scoped(where), patch as never),
  };
}
