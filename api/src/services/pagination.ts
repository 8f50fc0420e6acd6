import { Op, type WhereOptions } from 'sequelize';
import { Problem } from '../errors/problem.js';

/** Cursor = base64url of "createdAt-iso|id": stable under inserts, no offsets. */
export function encodeCursor(row: { createdAt: Date; id: string }): string {
  return Buffer.from(`${row.createdAt.toISOString()}|${row.id}`).toString('base64url');
}

export function decodeCursor(cursor: string): { createdAt: Date; id: string } {
  const [iso, id] = Buffer.from(cursor, 'base64url').toString('utf8').split('|');
  const createdAt = new Date(iso ?? '');
  if (!id || Number.isNaN(createdAt.getTime())) {
    throw new Problem('validation', 'The cursor is not one this API issued', { errors: [{ detail: 'invalid cursor', parameter: 'cursor' }] });
  }
  return { createdAt, id };
}

/** Where-clause for rows after the cursor in (createdAt, id) ascending order. */
export function afterCursor(cursor: string | undefined): WhereOptions {
  if (!cursor) return {};
  const c = decodeCursor(cursor);
  return {
    [Op.or]: [{ createdAt: { [Op.gt]: c.createdAt } }, { createdAt: c.createdAt, id: { [Op.gt]: c.id } }],
  };
}

export interface Page<T> {
  items: T[];
  nextCursor: string | null;
  total: number;
}

/** Builds a page from `limit + 1` fetched rows. */
export function toPage<R extends { createdAt: Date; id: string }, T>(rows: R[], limit: number, total: number, map: (r: R) => T): Page<T> {
  const more = rows.length > limit;
  const kept = more ? rows.slice(0, limit) : rows;
  const last = kept[kept.length - 1];
  return { items: kept.map(map), nextCursor: more && last ? encodeCursor(last) : null, total };
}
