import { z } from 'zod';
import { json, readQuery, route } from '@/lib/server/http';
import { listMail } from '@/lib/server/users';

const q = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  to: z.string().max(254).optional(),
});

/** The local mail fake's messages (development and tests); admins only. */
export const GET = route(async (req, actor) => json(await listMail(actor, readQuery(req, q))));
