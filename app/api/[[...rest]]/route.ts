import { errorResponse } from '@/lib/server/http';
import { ApiError } from '@/lib/server/errors';

/** Any /api path that no route claims: the one JSON error shape, never an HTML page. */
function notFound(req: Request): Response {
  return errorResponse(new ApiError('not_found', `There is no API endpoint at ${new URL(req.url).pathname}. The API is described at /api/openapi.json.`));
}

export const GET = notFound;
export const HEAD = notFound;
export const POST = notFound;
export const PUT = notFound;
export const PATCH = notFound;
export const DELETE = notFound;
export const OPTIONS = notFound;
