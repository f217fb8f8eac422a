import { z } from 'zod';

/** Common list query: page, pageSize, sort, dir, free-text q. */
export function listQuery<S extends readonly [string, ...string[]]>(sorts: S, defaultSort: S[number]) {
  return z.object({
    q: z.string().max(200).optional(),
    page: z.coerce.number().int('page must be a whole number').min(1, 'page starts at 1').default(1),
    pageSize: z.coerce.number().int().min(1).max(100, 'at most 100 rows per page').default(20),
    sort: z.enum(sorts).default(defaultSort as S[number]),
    dir: z.enum(['asc', 'desc']).default('desc'),
  });
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export const iso = (d: Date | string | null | undefined): string | null => (d ? new Date(d).toISOString() : null);

/** `%q%` for LIKE with the user's own % and _ taken literally (MariaDB's default escape is \). */
export function contains(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
