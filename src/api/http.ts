// The one typed HTTP client: JSON in and out, our cross-site header, errors as ApiError.
export interface FieldError {
  path: string;
  message: string;
  /** The field in words, from the server ("Area", "Chapters, row 3: title"). */
  label?: string;
}

export class ApiError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public fields: FieldError[] = [],
    public body: Record<string, unknown> = {},
  ) {
    super(message);
  }
  /** The message for one field, for form feedback. */
  field(path: string): string | undefined {
    return this.fields.find((f) => f.path === path)?.message;
  }
}

let onUnauthorized: (() => void) | null = null;
export function setUnauthorizedHandler(fn: () => void) {
  onUnauthorized = fn;
}

export async function request<T>(
  method: string,
  url: string,
  body?: unknown,
  opts: { raw?: boolean; contentType?: string; cache?: RequestCache } & ChangeOptions = {},
): Promise<T> {
  const headers: Record<string, string> = {
    'X-Requested-With': 'Bayslate',
    Accept: 'application/json',
    ...keyHeaders(opts.idempotencyKey),
  };
  let payload: BodyInit | undefined;
  if (body !== undefined) {
    headers['Content-Type'] = opts.contentType ?? 'application/json';
    payload = typeof body === 'string' ? body : JSON.stringify(body);
  }
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: payload,
      credentials: 'same-origin',
      ...(opts.cache ? { cache: opts.cache } : {}),
    });
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }
  if (res.status === 401 && onUnauthorized && !url.startsWith('/api/auth/')) onUnauthorized();
  if (!res.ok) {
    let data: { error?: { code?: string; message?: string; fields?: FieldError[] } & Record<string, unknown> } = {};
    try {
      data = await res.json();
    } catch {
      /* not JSON */
    }
    throw new ApiError(
      res.status,
      data.error?.code ?? 'http_' + res.status,
      data.error?.message ?? `The server answered ${res.status}.`,
      data.error?.fields ?? [],
      data.error ?? {},
    );
  }
  if (opts.raw) return (await res.text()) as T;
  if (res.status === 204) return undefined as T;
  return (await res.json()) as T;
}

/** A change sent with a key happens once on the server, however often it is resent (the phone's waiting changes). */
export interface ChangeOptions {
  idempotencyKey?: string;
}
export const keyHeaders = (key: string | undefined): Record<string, string> => (key ? { 'Idempotency-Key': key } : {});

export const api = {
  get: <T>(url: string) => request<T>('GET', url),
  post: <T>(url: string, body: unknown = {}, opts: ChangeOptions = {}) => request<T>('POST', url, body, opts),
  put: <T>(url: string, body: unknown) => request<T>('PUT', url, body),
  patch: <T>(url: string, body: unknown, opts: ChangeOptions = {}) => request<T>('PATCH', url, body, opts),
  del: <T>(url: string) => request<T>('DELETE', url),
};

/** Builds a query string from defined values. */
export function qs(params: Record<string, string | number | boolean | null | undefined | (string | number)[]>): string {
  const u = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) {
    if (v === undefined || v === null || v === '') continue;
    if (Array.isArray(v)) v.forEach((x) => u.append(k, String(x)));
    else u.set(k, String(v));
  }
  const s = u.toString();
  return s ? `?${s}` : '';
}
