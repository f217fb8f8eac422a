import { STARTERS } from '@/lib/params/starters';
import { json, route } from '@/lib/server/http';

export const GET = route(async () => json({ items: STARTERS }));
