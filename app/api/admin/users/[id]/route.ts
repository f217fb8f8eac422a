import { clientAddress, json, readJson, route, routeId } from '@/lib/server/http';
import { updateUser, updateUserSchema } from '@/lib/server/users';

type P = { id: string };

/** {siteRole?, disabled?}; the last active admin cannot be demoted or disabled. */
export const PATCH = route<P>(async (req, actor, p) => {
  await updateUser(actor, routeId(p.id, 'user'), await readJson(req, updateUserSchema), clientAddress(req));
  return json({ ok: true });
});
