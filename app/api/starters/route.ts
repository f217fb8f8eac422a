import { STARTERS } from '@/lib/models/starters';
import { json, route } from '@/lib/server/http';

export const GET = route(async () => json({ items: STARTERS }));
