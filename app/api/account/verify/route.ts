import { clientAddress, json, readJson, route } from '@/lib/server/http';
import { verifyEmail, verifySchema } from '@/lib/server/users';

export const POST = route(async (req) => {
  await verifyEmail(await readJson(req, verifySchema), clientAddress(req));
  return json({ message: 'Your address is confirmed. You can sign in now.' });
});
