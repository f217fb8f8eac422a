import { clientAddress, json, readJson, route } from '@/lib/server/http';
import { requestReset, resetRequestSchema } from '@/lib/server/users';

export const POST = route(async (req) => {
  const message = await requestReset(await readJson(req, resetRequestSchema), clientAddress(req));
  return json({ message }, 202);
});
