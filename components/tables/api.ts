/** Client-side calls to our API: one error shape in, one Error class out. */
export class ApiClientError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;
  constructor(status: number, code: string, message: string, details: unknown) {
    super(message);
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

export async function fetcher<T = unknown>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) throw await toError(res);
  return res.json() as Promise<T>;
}

export async function send<T = unknown>(method: string, url: string, body?: unknown): Promise<T> {
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
