import type { ErrorEnvelope } from '@shared/contracts/common.ts';

export interface FieldError {
  path: string;
  message: string;
}

/** An error answer from the API, carrying the envelope's code, message and field errors. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    readonly requestId?: string,
  ) {
    super(message);
  }

  get fields(): FieldError[] {
    const d = this.details as { fields?: FieldError[] } | undefined;
    return d?.fields ?? [];
  }
}

type Query = Record<string, string | number | boolean | undefined | null>;

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  query?: Query;
  signal?: AbortSignal;
}

function withQuery(path: string, query?: Query) {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `${path}?${s}` : path;
}

/** The only fetch wrapper: same-origin, cookies, JSON in and out, errors as ApiError. */
export async function api<T>(path: string, { method = 'GET', body, query, signal }: RequestOptions = {}): Promise<T> {
  const isForm = body instanceof FormData;
  const res = await fetch(withQuery(`/api${path}`, query), {
    method,
    credentials: 'same-origin',
    headers: body === undefined || isForm ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
    body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
    signal,
  });
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  const json = text ? safeJson(text) : undefined;
  if (!res.ok) throw errorFrom(res.status, json);
  return json as T;
}

function errorFrom(status: number, json: unknown) {
  const env = json as Partial<ErrorEnvelope> | undefined;
  return new ApiError(status, env?.error?.code ?? 'http_error', env?.error?.message ?? `The server answered ${status}.`, env?.error?.details, env?.requestId);
}

/** A file answer (CSV, PDF) saved under the server's file name; errors arrive as ApiError like any other call. */
export async function download(path: string, { method = 'GET', body }: Pick<RequestOptions, 'method' | 'body'> = {}): Promise<void> {
  const res = await fetch(`/api${path}`, {
    method,
    credentials: 'same-origin',
    headers: body === undefined ? undefined : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) {
    const text = await res.text();
    throw errorFrom(res.status, text ? safeJson(text) : undefined);
  }
  const disposition = res.headers.get('content-disposition') ?? '';
  const fileName = /filename="?([^";]+)"?/i.exec(disposition)?.[1] ?? path.split('/').pop() ?? 'download';
  const url = URL.createObjectURL(await res.blob());
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  // The click has handed the blob to the browser; give it a moment before letting go.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function safeJson(text: string) {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}
