// One page of a list and the count of every row its filters let through, the way every list of the
// API answers `{ items, total }`.
import type { Knex } from 'knex';

export interface PageAsked {
  page: number;
  pageSize: number;
}

/**
 * Counts the rows `base` finds (its joins and filters, before any columns or order), then reads the
 * asked page of them: `rows` adds the columns and the order to a copy of `base`.
 */
export async function pageOf<Row>(
  base: Knex.QueryBuilder,
  asked: PageAsked,
  rows: (query: Knex.QueryBuilder) => Knex.QueryBuilder,
): Promise<{ rows: Row[]; total: number }> {
  const [{ count }] = await base.clone().count<{ count: number }[]>('* as count');
  const found: unknown = await rows(base.clone())
    .limit(asked.pageSize)
    .offset((asked.page - 1) * asked.pageSize);
  return { rows: found as Row[], total: Number(count) };
}
