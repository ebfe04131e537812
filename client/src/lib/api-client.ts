import type { ApiErrorBody } from '@shared/schemas/common';

/** A failed API call: the server's error body, or a stand-in when the server could not be reached. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    /** HTTP status; 0 when no response arrived. */
    readonly status: number,
    readonly code: string,
    message: string,
    /** Dotted path of the input field the server rejected, when it named one. */
    readonly field?: string,
    /** The parsed JSON body, when the server answered with JSON that is not an error body. */
    readonly body?: unknown,
  ) {
    super(message);
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
/** A JSON-serialisable value, or FormData for uploads. */
type Body = unknown;

const SAFE_METHODS: ReadonlySet<Method> = new Set(['GET']);
const CSRF_HEADER = 'x-csrf-token';

function isApiErrorBody(value: unknown): value is ApiErrorBody {
  const error = (value as ApiErrorBody | null)?.error;
  return typeof error === 'object' && error !== null && typeof error.code === 'string';
}

/** Turns a non-2xx response into an ApiError, whether the body is our JSON error, plain text or nothing. */
async function toApiError(response: Response): Promise<ApiError> {
  const text = await response.text().catch(() => '');
  let parsed: unknown = null;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    // Not JSON: a proxy page or a plain-text message such as a rate limiter's.
  }
  if (isApiErrorBody(parsed)) {
    const { code, message, field } = parsed.error;
    return new ApiError(response.status, code, message || `Request failed (${response.status})`, field);
  }
  const plain = text.trim();
  const message = plain && plain.length <= 300 && !plain.startsWith('<') ? plain : `The server answered ${response.status} ${response.statusText}`.trim();
  return new ApiError(response.status, `http_${response.status}`, message, undefined, parsed ?? undefined);
}

/**
 * The one way the client talks to the REST API: JSON in and out, same-origin cookies, and the
 * CSRF token on every state-changing request. The token lives only in memory; it is fetched when
 * missing and fetched again once if the server says it is no longer valid.
 */
export function createApiClient() {
  let csrfToken: string | null = null;
  let pendingToken: Promise<string> | null = null;

  async function send(method: Method, path: string, body: Body | undefined, signal?: AbortSignal): Promise<Response> {
    const headers: Record<string, string> = { accept: 'application/json' };
    let payload: BodyInit | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      headers['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    if (!SAFE_METHODS.has(method)) headers[CSRF_HEADER] = await getCsrfToken();
    try {
      return await fetch(path, { method, headers, body: payload, credentials: 'same-origin', signal });
    } catch (error) {
      if (signal?.aborted) throw error;
      throw new ApiError(0, 'network', 'Cannot reach the server. Check the connection and try again.');
    }
  }

  /** The current token; concurrent writes share one fetch of a missing token. */
  function getCsrfToken(): Promise<string> {
    if (csrfToken) return Promise.resolve(csrfToken);
    pendingToken ??= request<{ csrfToken: string }>('GET', '/api/auth/csrf')
      .then(({ csrfToken: fresh }) => (csrfToken = fresh))
      .finally(() => (pendingToken = null));
    return pendingToken;
  }

  async function request<T>(method: Method, path: string, body?: Body, signal?: AbortSignal): Promise<T> {
    let response = await send(method, path, body, signal);
    if (!response.ok && response.status === 403 && !SAFE_METHODS.has(method)) {
      const error = await toApiError(response);
      if (error.code !== 'csrf_invalid') throw error;
      csrfToken = null; // the session changed under us; fetch a fresh token and try once more
      response = await send(method, path, body, signal);
    }
    if (!response.ok) throw await toApiError(response);
    if (response.status === 204) return undefined as T;
    return (await response.json()) as T;
  }

  return {
    get: <T>(path: string, signal?: AbortSignal) => request<T>('GET', path, undefined, signal),
    post: <T>(path: string, body?: Body) => request<T>('POST', path, body),
    patch: <T>(path: string, body: Body) => request<T>('PATCH', path, body),
    put: <T>(path: string, body: Body) => request<T>('PUT', path, body),
    delete: <T = void>(path: string) => request<T>('DELETE', path),
    /** Keeps the token a sign-in or session check handed out. */
    rememberCsrfToken(token: string) {
      csrfToken = token;
    },
    /** Drops the token, e.g. after sign-out, so the next write fetches a new one. */
    forgetCsrfToken() {
      csrfToken = null;
    },
  };
}

export type ApiClient = ReturnType<typeof createApiClient>;

export const api = createApiClient();
