import { z } from 'zod';
import { json, queryId, readJson, readQuery, requireActor, route } from '@/lib/server/http';
import { createToken, createTokenSchema, listTokens, revokeToken } from '@/lib/server/tokens';

export const GET = route(async (_req, actor) => json({ items: await listTokens(requireActor(actor)) }));

/** {name, expiresInDays?, scope?: 'read' | 'write'}. The clear token is in this response only; the server keeps its sha256. */
export const POST = route(async (req, actor) => {
  const a = requireActor(actor);
  const r = await createToken(a, await readJson(req, createTokenSchema));
  return json({ token: r.token, ...r.info }, 201);
});

export const DELETE = route(async (req, actor) => {
  const a = requireActor(actor);
  const { id } = readQuery(req, z.object({ id: queryId('?id= of the token') }));
  await revokeToken(a, id);
  return new Response(null, { status: 204 });
});
