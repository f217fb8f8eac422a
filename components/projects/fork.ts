/**
 * The one fork call, shared by the project page's Fork button and the workspace. Both show the
 * failure inline, so the outcome comes back as a value rather than a throw.
 */
import { ApiClientError, send } from '@/components/ui/api';

export async function forkProject(projectId: number | string, revision?: number): Promise<{ id?: string; error?: string }> {
  try {
    const p = await send<{ id: number }>('POST', `/api/projects/${encodeURIComponent(String(projectId))}/fork`, revision ? { revision } : {});
    return { id: String(p.id) };
  } catch (e) {
    return { error: e instanceof ApiClientError ? e.message : 'The server could not be reached.' };
  }
}
