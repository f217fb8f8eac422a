/** Queued jobs from the page's side: wait for one to finish, and an export that may have to be made first. */
import { ApiClientError, fetcher, send } from '@/components/ui/api';
import type { JobInfo } from '@/lib/server/queue/service';
import type { DatasetInfo } from '@/lib/server/datasets';

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

/**
 * Upload a dataset (a FormData with "file" and "kind"). The server answers 201 with the stored dataset, or
 * 202 with the parse job when no worker got to the file in time: then follow the job (each poll goes to
 * onProgress) and read the dataset it stored. A refused file throws with the reader's message; nothing is
 * stored then.
 */
export async function uploadDatasetNow(projectId: number | string, form: FormData, onProgress?: (j: JobInfo) => void): Promise<DatasetInfo> {
  const url = `/api/projects/${encodeURIComponent(String(projectId))}/datasets`;
  const file = form.get('file');
  const first = await send<DatasetInfo | { job: JobInfo }>('POST', url, form);
  if (!('job' in first)) return first;
  onProgress?.(first.job);
  let done: JobInfo;
  try {
    done = await waitForJob(first.job.url, onProgress);
  } catch (e) {
    if (e instanceof ApiClientError && e.code === 'timed_out') throw new ApiClientError(422, e.code, 'This file took too long to read and was refused; nothing was stored.', e.details);
    if (e instanceof ApiClientError && e.code === 'cancelled') throw new ApiClientError(422, e.code, 'Reading the file was cancelled; nothing was stored.', e.details);
    throw e;
  }
  const id = (done.result as { dataset?: number } | null)?.dataset;
  if (id === undefined) throw new ApiClientError(500, 'internal', 'The file was read, but the server named no stored dataset.', null);
  // GET …/datasets/{id} is the file itself; the dataset's record comes from the list (newest first, by name).
  const name = file instanceof File ? file.name : '';
  const page = await fetcher<{ items: DatasetInfo[] }>(`${url}?${new URLSearchParams({ q: name.slice(0, 200), sort: 'created_at', dir: 'desc', pageSize: '100' })}`);
  const found = page.items.find((d) => d.id === id);
  if (!found) throw new ApiClientError(404, 'not_found', 'The file was stored, but the dataset is gone again (deleted meanwhile?).', null);
  return found;
}

/** "waiting for a worker", "reading the file · 40 %": a job's state in a few words. */
export function jobProgressText(j: Pick<JobInfo, 'state' | 'stage' | 'progress'>): string {
  if (j.state === 'queued') return 'waiting for a worker';
  const pct = Math.round(100 * (j.progress ?? 0));
  return `${j.stage ?? j.state}${pct > 0 ? ` · ${pct} %` : ''}`;
}
