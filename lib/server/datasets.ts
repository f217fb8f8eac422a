/**
 * Datasets: measured patterns (two or three columns) and structure files (XYZ, extended XYZ, CIF,
 * Tauforge JSON) uploaded to a project. Every file is parsed on upload by lib/formats in a queue worker
 * (a `parse` job with a time limit, so a hostile file cannot stall the server); a file that is empty,
 * too large, binary or unreadable gets a clear error and nothing is stored. A structure's summary carries its
 * space group (spaceGroupSummary).
 */
import { z } from 'zod';
import { db } from './db';
import { ApiError, type ErrorCode } from './errors';
import { access, type Actor } from './authz';
import { audit } from './audit';
import { iso, listQuery, type Page, contains } from './paging';
import { FormatError, readStructure, sniffFormat } from '../formats';
import { readMeasured } from '../formats/measured';
import { symbolOf } from '../structure/elements';
import { enqueue, getJob, type JobInfo } from './queue/service';
import { timeLimitMs } from './queue/limits';
import { ensureSymmetry } from './symmetry-wasm';
import { spaceGroupOf, SYMMETRY_ATOM_LIMITS } from '../structure/symmetry';
import type { Structure } from '../structure/types';

export const MAX_DATASET_BYTES = 20 * 1024 * 1024;
export const datasetListQuery = listQuery(['created_at', 'filename', 'size', 'kind'] as const, 'created_at');
export const uploadFieldsSchema = z.object({
  kind: z.enum(['auto', 'pattern', 'structure'], { message: 'kind is auto, pattern or structure' }).default('auto'),
});

export interface DatasetInfo {
  id: number;
  kind: 'pattern' | 'structure';
  filename: string;
  format: string;
  size: number;
  sha256: string;
  summary: Record<string, unknown>;
  uploadedBy: string | null;
  createdAt: string;
  downloadUrl: string;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function info(r: any): DatasetInfo {
  return {
    id: Number(r.id),
    kind: r.kind,
    filename: r.filename,
    format: r.format,
    size: Number(r.size),
    sha256: r.sha256,
    summary: typeof r.summary === 'string' ? JSON.parse(r.summary) : r.summary,
    uploadedBy: r.uploaded_by_name ?? null,
    createdAt: iso(r.created_at)!,
    downloadUrl: `/api/projects/${r.project_id}/datasets/${r.id}`,
  };
}

const PATTERN_EXT = new Set(['xy', 'xye', 'dat', 'csv', 'txt', 'chi', 'tsv']);
const STRUCTURE_EXT = new Set(['xyz', 'extxyz', 'cif', 'json']);

/** Text sniffing: NUL bytes or invalid UTF-8 mean a binary file, which no reader accepts. */
export function decodeText(bytes: Uint8Array): string {
  if (bytes.includes(0)) throw new ApiError('unsupported_media_type', 'This looks like a binary file. Upload plain text: a two-column pattern, XYZ, extended XYZ or CIF.');
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ApiError('unsupported_media_type', 'This file is not UTF-8 text. Upload plain text: a two-column pattern, XYZ, extended XYZ or CIF.');
  }
}

export interface Parsed {
  kind: 'pattern' | 'structure';
  format: string;
  summary: Record<string, unknown>;
}

/**
 * The space group of an uploaded periodic structure (moyo, symprec 1e-3 Å), up to SYMMETRY_ATOM_LIMITS.upload atoms
 * so the parse task stays well inside its time limit; above it, or for a finite structure, the reason instead.
 */
export function spaceGroupSummary(s: Structure): { spaceGroup: { number: number; symbol: string } | null; spaceGroupNote?: string } {
  const n = s.species.length;
  if (!s.cell) return { spaceGroup: null, spaceGroupNote: 'no periodic cell' };
  if (n > SYMMETRY_ATOM_LIMITS.upload) return { spaceGroup: null, spaceGroupNote: `not computed: more than ${SYMMETRY_ATOM_LIMITS.upload.toLocaleString('en-US')} atoms` };
  ensureSymmetry();
  const g = spaceGroupOf(s);
  return g ? { spaceGroup: g } : { spaceGroup: null, spaceGroupNote: 'the symmetry finder found none' };
}

export function parseUpload(text: string, filename: string, kind: 'auto' | 'pattern' | 'structure'): Parsed {
  const ext = filename.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1] ?? '';
  let chosen: 'pattern' | 'structure';
  if (kind !== 'auto') chosen = kind;
  else if (STRUCTURE_EXT.has(ext)) chosen = 'structure';
  else if (PATTERN_EXT.has(ext)) chosen = 'pattern';
  else {
    try {
      sniffFormat(text, filename);
      chosen = 'structure';
    } catch {
      chosen = 'pattern';
    }
  }
  try {
    if (chosen === 'structure') {
      const format = sniffFormat(text, filename);
      const s = readStructure(text, filename);
      const n = s.species.length;
      if (n === 0) throw new ApiError('unprocessable', 'The structure file holds no atoms.');
      const composition: Record<string, number> = {};
      for (let i = 0; i < n; i++) {
        const sym = s.species[i] === 0 ? 'X' : symbolOf(s.species[i]);
        composition[sym] = (composition[sym] ?? 0) + 1;
      }
      return { kind: 'structure', format, summary: { atoms: n, periodic: Boolean(s.cell), cell: s.cell ?? null, composition, ...spaceGroupSummary(s) } };
    }
    const p = readMeasured(text);
    let max = -Infinity;
    for (const v of p.intensity) max = Math.max(max, v);
    return { kind: 'pattern', format: 'two-column', summary: { axis: p.axis, points: p.x.length, xMin: p.x[0], xMax: p.x[p.x.length - 1], maxIntensity: max, hasSigma: Boolean(p.sigma) } };
  } catch (e) {
    if (e instanceof FormatError) throw new ApiError('unprocessable', `This file could not be read: ${e.message}`, { format: e.format, line: e.line ?? null });
    throw e;
  }
}

export interface UploadFile {
  name: string;
  type: string;
  bytes: Uint8Array;
}

const API_CODES = new Set<ErrorCode>(['bad_request', 'validation_failed', 'not_found', 'conflict', 'too_large', 'unsupported_media_type', 'unprocessable']);

/** Wait for a job row to leave the queue (the upload's answer), at most `ms`. */
async function settled(jobId: number, ms: number) {
  const until = Date.now() + ms;
  for (let delay = 25; ; delay = Math.min(250, delay * 1.5)) {
    const r = await db()('jobs').where({ id: jobId }).first('state', 'result', 'error');
    if (r.state !== 'queued' && r.state !== 'running') return r;
    if (Date.now() > until) return r;
    await new Promise((res) => setTimeout(res, delay));
  }
}

/**
 * Check access, then queue the parse. Answers the stored dataset when the worker is done in time, the
 * pending job when it is not, and the reader's error (nothing stored) when the file is refused.
 * Callers check access before they read the body; it is checked again here for other callers.
 */
export async function uploadDataset(actor: Actor | null, projectId: number, file: UploadFile | null, kind: 'auto' | 'pattern' | 'structure'): Promise<DatasetInfo | { job: JobInfo }> {
  await access(actor, projectId, 'edit');
  if (!file) throw new ApiError('validation_failed', 'Attach the file in the form field "file".', { fields: { file: 'required' } });
  if (file.bytes.length > MAX_DATASET_BYTES) throw new ApiError('too_large', `The file is ${(file.bytes.length / 1048576).toFixed(1)} MB; the limit is 20 MB.`);
  if (file.bytes.length === 0) throw new ApiError('unprocessable', 'The file is empty.');
  const filename = file.name.replace(/[\\/]/g, '_').replace(/[\u0000-\u001f]/g, '').slice(0, 255) || 'upload.txt';
  const text = decodeText(file.bytes);
  if (text.trim() === '') throw new ApiError('unprocessable', 'The file holds only blank space.');
  const mediaType = (file.type || 'text/plain').slice(0, 100);
  const { job } = await enqueue(actor!, projectId, 'parse', { filename, kind, mediaType, size: file.bytes.length }, { extra: { text } });
  const r = await settled(job.id, timeLimitMs('parse') + 20_000);
  if (r.state === 'done') {
    const result = typeof r.result === 'string' ? JSON.parse(r.result) : r.result;
    return getDataset(actor, projectId, Number(result.dataset));
  }
  if (r.state === 'failed' || r.state === 'cancelled') {
    const e = r.error ? JSON.parse(r.error) : { code: 'unprocessable', message: 'The file could not be read.', details: null };
    const code: ErrorCode = API_CODES.has(e.code) ? e.code : 'unprocessable';
    throw new ApiError(code, e.code === 'timed_out' ? `This file took too long to read (over ${timeLimitMs('parse') / 1000} s) and was refused; nothing was stored.` : e.message, e.details ?? null);
  }
  return { job: await getJob(actor, job.id) };
}

function dsQuery() {
  return db()('datasets as d').leftJoin('users as u', 'u.id', 'd.uploaded_by')
    .select('d.id', 'd.project_id', 'd.kind', 'd.filename', 'd.format', 'd.size', 'd.sha256', 'd.summary', 'd.created_at', 'u.name as uploaded_by_name');
}

export async function getDataset(actor: Actor | null, projectId: number, id: number): Promise<DatasetInfo> {
  await access(actor, projectId, 'read');
  const r = await dsQuery().where({ 'd.id': id, 'd.project_id': projectId }).first();
  if (!r) throw new ApiError('not_found', 'No such dataset in this project.');
  return info(r);
}

export async function datasetBytes(actor: Actor | null, projectId: number, id: number): Promise<{ info: DatasetInfo; bytes: Buffer; mediaType: string }> {
  const i = await getDataset(actor, projectId, id);
  const r = await db()('datasets').where({ id }).first('bytes', 'media_type');
  return { info: i, bytes: Buffer.from(r.bytes), mediaType: r.media_type };
}

export async function listDatasets(actor: Actor | null, projectId: number, q: z.infer<typeof datasetListQuery>): Promise<Page<DatasetInfo>> {
  await access(actor, projectId, 'read');
  const base = dsQuery().where('d.project_id', projectId);
  if (q.q) base.where('d.filename', 'like', contains(q.q));
  const [{ n }] = await db().count<{ n: number }[]>({ n: '*' }).from(base.clone().as('x'));
  const rows = await base.orderBy(`d.${q.sort}`, q.dir).orderBy('d.id', 'desc').limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map(info), total: Number(n), page: q.page, pageSize: q.pageSize };
}

export async function deleteDataset(actor: Actor | null, projectId: number, id: number): Promise<void> {
  await db().transaction(async (trx) => {
    await access(actor, projectId, 'edit', trx);
    const r = await trx('datasets').where({ id, project_id: projectId }).first('filename');
    if (!r) throw new ApiError('not_found', 'No such dataset in this project.');
    await trx('datasets').where({ id }).delete();
    await audit({ actorId: actor!.id, action: 'dataset.delete', targetType: 'dataset', targetId: id, details: { project: projectId, filename: r.filename } }, trx);
  });
}
