import { json, route } from '@/lib/server/http';
import { openApiDocument } from '@/lib/server/openapi';

export const GET = route(async () => json(openApiDocument(), 200, { 'cache-control': 'public, max-age=300' }));
