import { isApiErrorBody, type ErrorCode } from '@shared/errors';

/** A failed API call, with the server's stable code and its plain-language message. */
export class ApiError extends Error {
  override name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: ErrorCode | 'network',
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

type Query = Record<string, string | number | boolean | undefined>;

function withQuery(path: string, query?: Query): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined) params.set(k, String(v));
  const s = params.toString();
  return s ? `${path}?${s}` : path;
}

let csrfToken: string | null = null;
/** Set by the sign-in feature; sent on every state-changing request. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

async function request<T>(method: string, path: string, options: { query?: Query; body?: unknown } = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;
  let response: Response;
  try {
    response = await fetch(withQuery(`/api${path}`, options.query), {
      method,
      headers,
      credentials: 'same-origin',
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
    });
  } catch {
    throw new ApiError(0, 'network', 'Cutline could not be reached. Check your connection and try again.');
  }
  if (response.status === 204) return undefined as T;
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    if (isApiErrorBody(body)) throw new ApiError(response.status, body.error.code, body.error.message, body.error.details);
    throw new ApiError(response.status, 'internal', `The server answered ${response.status} without an explanation.`);
  }
  return body as T;
}

/**
 * A multipart upload with transfer progress. `fetch` cannot report upload progress, so this one
 * call uses XMLHttpRequest; errors become the same `ApiError` as everywhere else.
 * @param onProgress bytes sent and in all, as the browser reports them
 */
function upload<T>(path: string, form: FormData, onProgress: (sent: number, total: number) => void, signal?: AbortSignal): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (csrfToken) xhr.setRequestHeader('X-CSRF-Token', csrfToken);
    xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : 0);
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload was interrupted: Cutline could not be reached. Check your connection and try again.'));
    xhr.onabort = () => reject(new ApiError(0, 'network', 'The upload was cancelled.'));
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as T);
      if (isApiErrorBody(body)) return reject(new ApiError(xhr.status, body.error.code, body.error.message, body.error.details));
      reject(new ApiError(xhr.status, 'internal', `The server answered ${xhr.status} without an explanation.`));
    };
    signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(form);
  });
}

/** The one HTTP client of the app; feature `api/` files call it. */
export const api = {
  upload,
  get: <T>(path: string, query?: Query) => request<T>('GET', path, { query }),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, { body }),
  put: <T>(path: string, body?: unknown) => request<T>('PUT', path, { body }),
  patch: <T>(path: string, body?: unknown) => request<T>('PATCH', path, { body }),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
