/**
 * The one client the pages use to call our REST API (the same routes API tokens use). Every error
 * answer has the shape `{error: {code, message, details}}`; it leaves here as a thrown ApiClientError,
 * so a caller shows `message`, marks `fields`, or reads `details` (the newer head on a 409).
 */
export class ApiClientError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;
  constructor(status: number, code: string, message: string, details: unknown) {
    super(message);
    this.name = 'ApiClientError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
  /** Field errors from a validation failure, `{path: message}`. */
  get fields(): Record<string, string> {
    const d = this.details as { fields?: Record<string, string> } | null;
    return d?.fields ?? {};
  }
}

async function toError(res: Response): Promise<ApiClientError> {
  try {
    const b = await res.json();
    return new ApiClientError(res.status, b?.error?.code ?? 'error', b?.error?.message ?? res.statusText, b?.error?.details ?? null);
  } catch {
    return new ApiClientError(res.status, 'error', res.statusText || `HTTP ${res.status}`, null);
  }
}

/** GET a JSON resource; also the fetcher for SWR. */
export async function fetcher<T = unknown>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) throw await toError(res);
  return res.json() as Promise<T>;
}

/** GET a file (an export, a dataset) as bytes, with the same errors as every other call. */
export async function getBlob(url: string): Promise<Blob> {
  const res = await fetch(url);
  if (!res.ok) throw await toError(res);
  return res.blob();
}

/** POST, PATCH or DELETE: a plain object goes as JSON, FormData as a multipart upload. 204 gives undefined. */
export async function send<T = unknown>(method: 'POST' | 'PATCH' | 'DELETE', url: string, body?: unknown): Promise<T> {
  const init: RequestInit = { method, headers: { accept: 'application/json' } };
  if (body instanceof FormData) init.body = body;
  else if (body !== undefined) {
    init.body = JSON.stringify(body);
    init.headers = { ...init.headers, 'content-type': 'application/json' };
  }
  const res = await fetch(url, init);
  if (!res.ok) throw await toError(res);
  if (res.status === 204) return undefined as T;
  return res.json() as Promise<T>;
}
