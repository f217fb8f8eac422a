/**
 * The Check step over the API: the report for a saved revision (generated off the request thread in the export
 * worker process, within the revision's own point cap, like an export) or for a structure file sent in the body
 * (parsed by lib/formats, at most DEFAULT_MAX_POINTS atoms and 20 MB of text). Both carry the space group (up to
 * SYMMETRY_ATOM_LIMITS.server atoms; above, `spaceGroupNote` says why not). Nothing is stored.
 */
import { z } from 'zod';
import { db } from './db';
import { ApiError } from './errors';
import { access, type Actor } from './authz';
import { renderExport } from './export-worker';
import { estimateCount } from '../models';
import { MAX_DATASET_BYTES } from './datasets';
import { readStructure } from '../formats/read';
import { checkStructure, type CheckReport } from '../structure/checks/report';
import { DEFAULT_MAX_POINTS } from '../models/point-cap';
import { spaceGroupOf, SYMMETRY_ATOM_LIMITS } from '../structure/symmetry';
import { ensureSymmetry } from './symmetry-wasm';

/** Revisions up to this many estimated atoms are checked in the request. */
const INLINE_CHECK_POINTS = 20_000;

export const checkRequestSchema = z.union(
  [
    z.strictObject({ revision: z.number().int().positive() }),
    z.strictObject({
      structure: z.string().min(1, 'structure: send the file text').max(MAX_DATASET_BYTES, 'structure: at most 20 MB of text'),
      filename: z.string().max(200).optional(),
    }),
  ],
  { message: 'send {revision} for a saved revision, or {structure, filename?} with the text of an XYZ, extended XYZ, CIF or Tauforge JSON file' },
);

export async function checkForProject(actor: Actor | null, projectId: number, input: z.infer<typeof checkRequestSchema>): Promise<{ revision?: number; report: CheckReport }> {
  await access(actor, projectId, 'read');
  if ('revision' in input) {
    const rev = await db()('revisions').where({ id: input.revision, project_id: projectId }).first('id', 'params');
    if (!rev) throw new ApiError('not_found', 'No such revision in this project.');
    const params = typeof rev.params === 'string' ? JSON.parse(rev.params) : rev.params;
    // Small cuts are checked here (a few hundred ms at most); larger ones belong on the job queue, where every
    // export carries the same check in its comment line.
    let estimate: number;
    try {
      estimate = estimateCount(params);
    } catch (e) {
      throw new ApiError('unprocessable', (e as Error).message);
    }
    if (estimate > INLINE_CHECK_POINTS) {
      throw new ApiError('unprocessable', `This revision cuts about ${Math.round(estimate).toLocaleString('en-US')} atoms; the API checks up to ${INLINE_CHECK_POINTS.toLocaleString('en-US')} directly. Start an export job: every export carries the check's verdict.`);
    }
    return { revision: Number(rev.id), report: JSON.parse(renderExport(params, 'check')) as CheckReport };
  }
  let s;
  try {
    s = readStructure(input.structure, input.filename);
  } catch (e) {
    throw new ApiError('unprocessable', (e as Error).message);
  }
  if (s.species.length > DEFAULT_MAX_POINTS) {
    throw new ApiError('unprocessable', `The structure has ${s.species.length.toLocaleString('en-US')} atoms; the check takes at most ${DEFAULT_MAX_POINTS.toLocaleString('en-US')}.`);
  }
  // The space group (moyo, symprec 1e-3 Å) up to the server's limit; above it the report says it was not computed.
  ensureSymmetry();
  return { report: checkStructure(s, { spaceGroup: spaceGroupOf, spaceGroupMaxAtoms: SYMMETRY_ATOM_LIMITS.server }) };
}
