/**
 * The OpenAPI 3.1 document served at /api/openapi.json. Request bodies come from the same zod
 * schemas the routes parse with (z.toJSONSchema), so the document cannot drift from the checks.
 */
import { z } from 'zod';
import { createProjectSchema, forkSchema, updateProjectSchema } from './projects';
import { restoreSchema, saveRevisionSchema } from './revisions';
import { changeRoleSchema, inviteSchema, acceptSchema } from './members';
import { createExportSchema } from './exports';
import { checkRequestSchema } from './check';
import { startJobSchema } from './queue/kinds';
import { savePointSchema } from './queue/service';
import { createTokenSchema } from './tokens';
import { resetRequestSchema, resetSchema, signUpSchema, updateUserSchema, verifySchema } from './users';

function schema(s: z.ZodType): unknown {
  return z.toJSONSchema(s, { io: 'input', unrepresentable: 'any' });
}

const errorRef = { $ref: '#/components/schemas/Error' };

interface Op {
  summary: string;
  body?: z.ZodType;
  multipart?: boolean;
  query?: string[];
  ok: number;
  auth?: boolean;
}

function op(o: Op, pathParams: string[]) {
  const parameters = [
    ...pathParams.map((n) => ({ name: n, in: 'path', required: true, schema: { type: 'integer' } })),
    ...(o.query ?? []).map((n) => ({ name: n, in: 'query', required: false, schema: { type: 'string' } })),
  ];
  return {
    summary: o.summary,
    ...(parameters.length ? { parameters } : {}),
    ...(o.body ? { requestBody: { required: true, content: { 'application/json': { schema: schema(o.body) } } } } : {}),
    ...(o.multipart
      ? { requestBody: { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties: { file: { type: 'string', format: 'binary' }, kind: { enum: ['auto', 'pattern', 'structure'] } }, required: ['file'] } } } } }
      : {}),
    ...(o.auth === false ? { security: [] } : {}),
    responses: {
      [o.ok]: { description: 'Success' },
      default: { description: 'Error', content: { 'application/json': { schema: errorRef } } },
    },
  };
}

const list = ['q', 'page', 'pageSize', 'sort', 'dir'];

const PATHS: Record<string, Record<string, Op>> = {
  '/api/account/signup': { post: { summary: 'Sign up; a confirmation link goes by mail', body: signUpSchema, ok: 202, auth: false } },
  '/api/account/verify': { post: { summary: 'Confirm an address with the token from the mail', body: verifySchema, ok: 200, auth: false } },
  '/api/account/reset': { post: { summary: 'Ask for a password reset link', body: resetRequestSchema, ok: 202, auth: false } },
  '/api/account/reset/confirm': { post: { summary: 'Set a new password with the reset token', body: resetSchema, ok: 200, auth: false } },
  '/api/account/sessions': { delete: { summary: 'Sign out everywhere: end every session of your account (browser sessions only)', ok: 204 } },
  '/api/me': { get: { summary: 'Who the request is signed in as', ok: 200 } },
  '/api/starters': { get: { summary: 'Starting models for new projects', ok: 200, auth: false } },
  '/api/projects': {
    get: { summary: 'List your projects (scope=mine) or public ones (scope=public)', query: [...list, 'scope', 'tag'], ok: 200 },
    post: { summary: 'Create a project from a starter or params', body: createProjectSchema, ok: 201 },
  },
  '/api/projects/{id}': {
    get: { summary: 'A project with its head revision, lineage and your permissions', ok: 200 },
    patch: { summary: 'Change name, description, tags or visibility (owners)', body: updateProjectSchema, ok: 200 },
    delete: { summary: 'Delete a project (owners, site admins)', ok: 204 },
  },
  '/api/projects/{id}/revisions': {
    get: { summary: 'Revision history', query: list, ok: 200 },
    post: { summary: 'Save a new revision; 409 with the newer head when baseRevision is stale', body: saveRevisionSchema, ok: 201 },
  },
  '/api/projects/{id}/revisions/{rid}': { get: { summary: 'One revision', ok: 200 } },
  '/api/projects/{id}/revisions/{rid}/restore': { post: { summary: 'New revision copying an old one', body: restoreSchema, ok: 201 } },
  '/api/projects/{id}/diff': { get: { summary: 'JSON-path diff of params between two revisions', query: ['from', 'to'], ok: 200 } },
  '/api/projects/{id}/fork': { post: { summary: 'Fork into a new project you own, with the revisions of the parent up to the fork point', body: forkSchema, ok: 201 } },
  '/api/projects/{id}/members': {
    get: { summary: 'Members and pending invitations', ok: 200 },
    post: { summary: 'Invite by e-mail', body: inviteSchema, ok: 201 },
    patch: { summary: 'Change a member’s role', body: changeRoleSchema, ok: 200 },
    delete: { summary: 'Remove a member (?userId) or withdraw an invitation (?invitation)', query: ['userId', 'invitation'], ok: 204 },
  },
  '/api/projects/{id}/exports': {
    get: { summary: 'Stored exports', query: list, ok: 200 },
    post: { summary: 'Export a revision: 200 with the stored file, or 202 with the export job (Location: the job; identical requests join it)', body: createExportSchema, ok: 202 },
  },
  '/api/exports/{id}/download': { get: { summary: 'The export’s bytes', ok: 200 } },
  '/api/projects/{id}/check': { post: { summary: 'The Check step’s report (distances, density, composition, warnings) for a revision or a structure file’s text', body: checkRequestSchema, ok: 200 } },
  '/api/projects/{id}/datasets': {
    get: { summary: 'Uploaded datasets', query: list, ok: 200 },
    post: { summary: 'Upload a measured pattern or structure file (≤ 20 MB), parsed by a queue worker: 201 with the dataset, 202 with the parse job when the queue is busy', multipart: true, ok: 201 },
  },
  '/api/projects/{id}/datasets/{did}': {
    get: { summary: 'The dataset file', ok: 200 },
    delete: { summary: 'Delete a dataset (editors, owners)', ok: 204 },
  },
  '/api/projects/{id}/jobs': {
    get: { summary: 'The project’s jobs, newest first, with state and progress', query: list, ok: 200 },
    post: { summary: 'Start a job (diffraction, index, sweep, export): 202 with the job (Location: its URL); identical pending requests join one job', body: startJobSchema, ok: 202 },
  },
  '/api/jobs/{id}': {
    get: { summary: 'A job: state, progress, timings, result or error', ok: 200 },
    delete: { summary: 'Cancel a job (the one who started it, or an editor); 409 when it has finished', ok: 200 },
  },
  '/api/jobs/{id}/cancel': { post: { summary: 'Cancel a job (same as DELETE /api/jobs/{id})', ok: 200 } },
  '/api/jobs/{id}/points': { get: { summary: 'A sweep’s grid points ranked by R_wp, best first', query: ['page', 'pageSize'], ok: 200 } },
  '/api/jobs/{id}/save': { post: { summary: 'Save a sweep point (the best unless named) as a new revision', body: savePointSchema, ok: 201 } },
  '/api/invitations': {
    get: { summary: 'What an invitation token is for', query: ['token'], ok: 200, auth: false },
    post: { summary: 'Accept an invitation', body: acceptSchema, ok: 200 },
  },
  '/api/tokens': {
    get: { summary: 'Your API tokens (never the secrets)', ok: 200 },
    post: { summary: 'Create an API token; the secret is shown once', body: createTokenSchema, ok: 201 },
    delete: { summary: 'Revoke a token (?id)', query: ['id'], ok: 204 },
  },
  '/api/admin/users': { get: { summary: 'All users (site admins)', query: list, ok: 200 } },
  '/api/admin/users/{id}': { patch: { summary: 'Change a user’s site role or disable them (site admins)', body: updateUserSchema, ok: 200 } },
  '/api/admin/mail': { get: { summary: 'Messages caught by the local mail fake (site admins)', query: ['page', 'pageSize', 'to'], ok: 200 } },
  '/api/openapi.json': { get: { summary: 'This document', ok: 200, auth: false } },
};

export function openApiDocument(): Record<string, unknown> {
  const paths: Record<string, unknown> = {};
  for (const [p, ops] of Object.entries(PATHS)) {
    const params = [...p.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
    paths[p] = Object.fromEntries(Object.entries(ops).map(([method, o]) => [method, op(o, params)]));
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Tauforge API', version: '1', description: 'Projects, revisions, forks, members, exports and datasets. Authenticate with a personal API token: Authorization: Bearer tfk_…' },
    components: {
      securitySchemes: { token: { type: 'http', scheme: 'bearer', description: 'Personal API token from Settings → API tokens' }, session: { type: 'apiKey', in: 'cookie', name: 'next-auth.session-token' } },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: { error: { type: 'object', required: ['code', 'message'], properties: { code: { type: 'string' }, message: { type: 'string' }, details: {} } } },
        },
      },
    },
    security: [{ token: [] }, { session: [] }],
    paths,
  };
}

/** For the route-coverage test: every path the document describes, in Next.js folder form. */
export const OPENAPI_PATHS = Object.keys(PATHS);
