import { vi } from 'vitest';

/** A JSON response as the server sends it. */
export function json(status: number, body?: unknown): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

type Reply = Response | ((init: RequestInit) => Response);

/**
 * Replaces global fetch with a stub answering "METHOD /path" keys. A key given a list answers
 * with its entries in turn (the last one repeats). Any other request fails the test loudly.
 */
export function stubFetch(routes: Record<string, Reply | Reply[]>) {
  const served = new Map<string, number>();
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const key = `${init.method ?? 'GET'} ${String(input)}`;
    const route = routes[key];
    if (!route) throw new Error(`unexpected request: ${key}`);
    const replies = Array.isArray(route) ? route : [route];
    const n = served.get(key) ?? 0;
    served.set(key, n + 1);
    const reply = replies[Math.min(n, replies.length - 1)];
    return typeof reply === 'function' ? reply(init) : reply.clone();
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

/** Method, path, headers and parsed JSON body of each call made to the stub. */
export function requests(fetchMock: ReturnType<typeof stubFetch>) {
  return fetchMock.mock.calls.map(([input, init = {}]) => ({
    key: `${init.method ?? 'GET'} ${String(input)}`,
    headers: (init.headers ?? {}) as Record<string, string>,
    credentials: init.credentials,
    body: typeof init.body === 'string' ? JSON.parse(init.body) : init.body,
  }));
}
