import { clientAddress, json, readJson, route } from '@/lib/server/http';
import { signUp, signUpSchema } from '@/lib/server/users';

export const POST = route(async (req) => {
  const input = await readJson(req, signUpSchema);
  // 202: accepted, the outcome arrives by mail (RFC 9110 §15.3.3).
  return json(await signUp(input, clientAddress(req)), 202);
});
