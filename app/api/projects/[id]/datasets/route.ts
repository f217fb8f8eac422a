import { ApiError } from '@/lib/server/errors';
import { json, parseWith, readFormCapped, readQuery, route, routeId } from '@/lib/server/http';
import { datasetListQuery, listDatasets, MAX_DATASET_BYTES, uploadDataset, uploadFieldsSchema } from '@/lib/server/datasets';
import { access } from '@/lib/server/authz';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await listDatasets(actor, routeId(p.id), readQuery(req, datasetListQuery))));

/**
 * multipart/form-data with a "file" field (and optional "kind": auto | pattern | structure).
 * Access is checked before a byte of the body is read; the file is parsed by a queue worker with a
 * time limit. 201 with the dataset, or 202 with the parse job when the queue is busy.
 */
export const POST = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  await access(actor, id, 'edit');
  const length = Number(req.headers.get('content-length') ?? 0);
  // Refuse before reading a body that cannot fit (the multipart envelope adds a few hundred bytes).
  if (length > MAX_DATASET_BYTES + 64 * 1024) throw new ApiError('too_large', `The upload is ${(length / 1048576).toFixed(1)} MB; the limit is 20 MB.`);
  if (!/^multipart\/form-data/i.test(req.headers.get('content-type') ?? '')) {
    throw new ApiError('unsupported_media_type', 'Send the file as multipart/form-data in a field called "file".');
  }
  // The body is read with a cap (a missing or false content-length cannot make it read more).
  const form = await readFormCapped(req, MAX_DATASET_BYTES + 64 * 1024);
  const fields = parseWith(uploadFieldsSchema, { kind: form.get('kind') ?? undefined }, 'upload form');
  const f = form.get('file');
  const file = f && typeof f !== 'string' ? { name: f.name, type: f.type, bytes: new Uint8Array(await f.arrayBuffer()) } : null;
  const ds = await uploadDataset(actor, id, file, fields.kind);
  if ('job' in ds) return json({ job: ds.job }, 202, { location: ds.job.url });
  return json(ds, 201);
});
