import { clientAddress, json, readJson, route } from '@/lib/server/http';
import { resetPassword, resetSchema } from '@/lib/server/users';

export const POST = route(async (req) => {
  await resetPassword(await readJson(req, resetSchema), clientAddress(req));
  return json({ message: 'Your password is changed. Sign in with the new one.' });
});
