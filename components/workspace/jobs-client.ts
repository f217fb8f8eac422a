/** Queued jobs from the page's side: wait for one to finish, and an export that may have to be made first. */
import { ApiClientError, fetcher, send } from '@/components/ui/api';
import type { JobInfo } from '@/lib/server/queue/service';

export type { JobInfo };

export const isActive = (j: Pick<JobInfo, 'state'>) => j.state === 'queued' || j.state === 'running';

/** Poll a job until it leaves the queue; a failed or cancelled job throws with the worker's message. */
export async function waitForJob(url: string, onProgress?: (j: JobInfo) => void, signal?: AbortSignal): Promise<JobInfo> {
  for (let delay = 300; ; delay = Math.min(2000, delay * 1.3)) {
    const j = await fetcher<JobInfo>(url);
    onProgress?.(j);
    if (j.state === 'done') return j;
    if (j.state === 'failed' || j.state === 'cancelled') {
      throw new ApiClientError(422, j.error?.code ?? j.state, j.error?.message ?? `The job was ${j.state}.`, j.error?.details ?? null);
    }
    if (signal?.aborted) throw new ApiClientError(499, 'aborted', 'Stopped waiting.', null);
    await new Promise((r) => setTimeout(r, delay));
  }
}

interface StoredExport {
  id: number;
  filename: string;
  sha256: string;
  reused?: boolean;
}

/** POST an export; when it has to be made, wait for its job, then ask again for the stored file. */
export async function exportNow(projectId: number, revision: number, format: string, onProgress?: (j: JobInfo) => void): Promise<StoredExport> {
  const url = `/api/projects/${projectId}/exports`;
  // 'cif-p1': the CIF in P 1 with every atom (the API's cifSymmetry option); plain 'cif' carries the space group.
  const body = format === 'cif-p1' ? { revision, format: 'cif', cifSymmetry: 'p1' } : { revision, format };
  const first = await send<StoredExport | { job: JobInfo }>('POST', url, body);
  if (!('job' in first)) return first;
  await waitForJob(first.job.url, onProgress);
  return { ...(await send<StoredExport>('POST', url, body)), reused: false };
}
