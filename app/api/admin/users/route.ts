import { json, readQuery, route } from '@/lib/server/http';
import { listUsers, userListQuery } from '@/lib/server/users';

export const GET = route(async (req, actor) => json(await listUsers(actor, readQuery(req, userListQuery))));
