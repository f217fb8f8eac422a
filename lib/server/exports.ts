/**
 * Exports: a revision written as XYZ, extended XYZ, CIF or Tauforge JSON, generated off the request
 * thread (lib/server/jobs.ts) and kept in MariaDB with sha256(bytes), sha256(canonical params) and
 * the engine version. One stored export per (revision, format, engine version): asking again
 * returns the stored bytes, so the same revision and format always download identically.
 */
import { z } from 'zod';
import { db } from './db';
import { ApiError } from './errors';
import { access, type Actor } from './authz';
import { audit } from './audit';
import { paramsHash, sha256Hex } from './crypto';
import { iso, listQuery, type Page } from './paging';
import { runExportJob } from './jobs';
import { ENGINE_VERSION } from '../version';

/** Coordinates, plus 'peaks-csv': the powder peak list of a periodic cell (Cu Kα1 X-rays, 2θ 5–120°). */
export const EXPORT_FORMATS = ['xyz', 'extxyz', 'cif', 'json', 'poscar', 'lammps', 'peaks-csv'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

const EXT: Record<ExportFormat, string> = { xyz: 'xyz', extxyz: 'extxyz', cif: 'cif', json: 'json', poscar: 'vasp', lammps: 'lmp', 'peaks-csv': 'peaks.csv' };
const MEDIA: Record<ExportFormat, string> = {
  xyz: 'chemical/x-xyz',
  extxyz: 'chemical/x-xyz',
  cif: 'chemical/x-cif',
  json: 'application/json',
  poscar: 'text/plain',
  lammps: 'text/plain',
  'peaks-csv': 'text/csv',
};

export const createExportSchema = z.strictObject({
  revision: z.number({ message: 'send the revision id' }).int().positive(),
  format: z.enum(EXPORT_FORMATS, { message: `format is one of ${EXPORT_FORMATS.join(', ')}` }),
  /** n₁×n₂×n₃ repeats of a periodic cell, e.g. "2x2x1" (each 1–10, at most 1000 copies). */
  supercell: z
    .string()
    .regex(/^\s*(10|[1-9])\s*x\s*(10|[1-9])\s*x\s*(10|[1-9])\s*$/i, 'supercell: three whole numbers 1–10 such as 2x2x1')
    .optional(),
});

/**
 * The stored format key: the format, and "@n1xn2xn3" for a supercell other than 1x1x1 (the exports table keeps one
 * row per revision, key and engine version; the export worker reads the suffix).
 */
function formatKey(format: ExportFormat, supercell?: string): string {
  const n = supercell?.toLowerCase().replace(/\s+/g, '');
  return n && n !== '1x1x1' ? `${format}@${n}` : format;
}
export const exportListQuery = listQuery(['created_at', 'size', 'format'] as const, 'created_at');

export interface ExportInfo {
  id: number;
  revision: number;
  revisionNumber: number;
  format: ExportFormat;
  /** "n1xn2xn3" when the export is a supercell. */
  supercell?: string;
  size: number;
  sha256: string;
  paramsHash: string;
  engineVersion: string;
  createdAt: string;
  filename: string;
  downloadUrl: string;
}

function slug(name: string): string {
  return name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'model';
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function info(r: any): ExportInfo {
  const [format, supercell] = String(r.format).split('@') as [ExportFormat, string | undefined];
  return {
    id: Number(r.id),
    revision: Number(r.revision_id),
    revisionNumber: Number(r.number),
    format,
    ...(supercell ? { supercell } : {}),
    size: Number(r.size),
    sha256: r.sha256,
    paramsHash: r.params_hash,
    engineVersion: r.engine_version,
    createdAt: iso(r.created_at)!,
    filename: `${slug(r.project_name)}-r${r.number}${supercell ? `-${supercell}` : ''}.${EXT[format] ?? format}`,
    downloadUrl: `/api/exports/${r.id}/download`,
  };
}

function exportQuery() {
  return db()('exports as e')
    .join('revisions as r', 'r.id', 'e.revision_id')
    .join('projects as p', 'p.id', 'r.project_id')
    .select('e.id', 'e.revision_id', 'e.format', 'e.size', 'e.sha256', 'e.params_hash', 'e.engine_version', 'e.created_at', 'r.number', 'r.project_id', 'p.name as project_name');
}

export async function createExport(actor: Actor | null, projectId: number, input: z.infer<typeof createExportSchema>): Promise<{ export: ExportInfo; reused: boolean }> {
  await access(actor, projectId, 'export');
  const rev = await db()('revisions').where({ id: input.revision, project_id: projectId }).first('id', 'params');
  if (!rev) throw new ApiError('not_found', 'No such revision in this project.');
  const key = formatKey(input.format, input.supercell);
  const find = () => exportQuery().where({ 'e.revision_id': rev.id, 'e.format': key, 'e.engine_version': ENGINE_VERSION }).first();
  const existing = await find();
  if (existing) return { export: info(existing), reused: true };
  const params = typeof rev.params === 'string' ? JSON.parse(rev.params) : rev.params;
  const bytes = await runExportJob(params, key);
  try {
    await db().transaction(async (trx) => {
      const [id] = await trx('exports').insert({
        revision_id: rev.id,
        format: key,
        bytes,
        sha256: sha256Hex(bytes),
        params_hash: paramsHash(params),
        engine_version: ENGINE_VERSION,
        size: bytes.length,
        created_by: actor!.id,
      });
      await audit({ actorId: actor!.id, action: 'export.create', targetType: 'export', targetId: id, details: { project: projectId, revision: Number(rev.id), format: key } }, trx);
    });
  } catch (e) {
    // Two requests raced to make the same export: the first one stored it; answer with that one.
    if (!(e instanceof Error && /Duplicate/.test(e.message))) throw e;
    return { export: info(await find()), reused: true };
  }
  return { export: info(await find()), reused: false };
}

export async function listExports(actor: Actor | null, projectId: number, q: z.infer<typeof exportListQuery>): Promise<Page<ExportInfo>> {
  await access(actor, projectId, 'read');
  const base = exportQuery().where('r.project_id', projectId);
  if (q.q) base.where('e.format', q.q);
  const [{ n }] = await db().count<{ n: number }[]>({ n: '*' }).from(base.clone().as('x'));
  const rows = await base.orderBy(`e.${q.sort}`, q.dir).orderBy('e.id', 'desc').limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map(info), total: Number(n), page: q.page, pageSize: q.pageSize };
}

export async function downloadExport(actor: Actor | null, exportId: number): Promise<{ info: ExportInfo; bytes: Buffer; mediaType: string }> {
  const row = await exportQuery().where('e.id', exportId).first();
  if (!row) throw new ApiError('not_found', 'No such export, or you cannot see it.');
  try {
    await access(actor, Number(row.project_id), 'read');
  } catch (e) {
    if (e instanceof ApiError && e.code === 'not_found') throw new ApiError('not_found', 'No such export, or you cannot see it.');
    throw e;
  }
  const b = await db()('exports').where({ id: exportId }).first('bytes');
  return { info: info(row), bytes: Buffer.from(b.bytes), mediaType: MEDIA[String(row.format).split('@')[0] as ExportFormat] ?? 'application/octet-stream' };
}
