import { vi } from 'vitest';

/** A JSON Response as the Holdfire server would send it. */
export function json(status: number, body?: unknown): Response {
  if (body === undefined) return new Response(null, { status });
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

type Handler = (init: RequestInit & { url: string }) => Response | Promise<Response>;

/**
 * Stub global fetch with a tiny route table keyed "METHOD /path". Unknown routes answer 404 so a test
 * fails loudly instead of hanging. Returns the mock so tests can inspect calls.
 */
export function fakeApi(routes: Record<string, Handler | Response | (() => Response)>) {
  const mock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.pathname : input.url;
    const key = `${(init.method ?? 'GET').toUpperCase()} ${url}`;
    const route = routes[key];
    if (!route) return json(404, { error: `No fake for ${key}`, code: 'not_found' });
    if (route instanceof Response) return route.clone();
    return (route as Handler)({ ...init, url });
  });
  vi.stubGlobal('fetch', mock);
  return mock;
}

export function headerOf(init: RequestInit | undefined, name: string): string | undefined {
  const headers = (init?.headers ?? {}) as Record<string, string>;
  const found = Object.keys(headers).find((key) => key.toLowerCase() === name.toLowerCase());
  return found ? headers[found] : undefined;
}
