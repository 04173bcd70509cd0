import { beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, dropCsrfToken } from '../../src/lib/api';
import { headerOf, json } from './fake-api';

type Call = [string, RequestInit];

function calls(mock: ReturnType<typeof vi.fn>): Call[] {
  return mock.mock.calls as unknown as Call[];
}

describe('api client', () => {
  beforeEach(() => dropCsrfToken());

  it('fetches the CSRF token once and sends it on every write, not on reads', async () => {
    const fetchMock = vi.fn(async (url: string, init: RequestInit) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: 'token-one' });
      if (init.method === 'GET') return json(200, { status: 'ok' });
      return json(200, { ok: true });
    });
    vi.stubGlobal('fetch', fetchMock);

    await api.get('/api/health');
    await api.post('/api/things', { name: 'Kestrel-2' });
    await api.patch('/api/things/1', { name: 'Kestrel-2B' });

    const all = calls(fetchMock);
    expect(all.filter(([url]) => url === '/api/auth/csrf')).toHaveLength(1);
    const health = all.find(([url]) => url === '/api/health')!;
    expect(headerOf(health[1], 'X-CSRF-Token')).toBeUndefined();
    for (const [url, init] of all.filter(([u]) => u.startsWith('/api/things'))) {
      expect(headerOf(init, 'X-CSRF-Token'), url).toBe('token-one');
      expect(init.credentials).toBe('same-origin');
      expect(headerOf(init, 'Content-Type')).toBe('application/json');
    }
    expect(all.find(([url]) => url === '/api/things')![1].body).toBe(JSON.stringify({ name: 'Kestrel-2' }));
  });

  it('sends a FormData body as multipart (no JSON type, the CSRF header still set), and resends it on a CSRF retry', async () => {
    let tokens = 0;
    const bodies: unknown[] = [];
    const fetchMock = vi.fn(async (url: string, init: RequestInit) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: `token-${++tokens}` });
      bodies.push(init.body);
      if (headerOf(init, 'X-CSRF-Token') === 'token-1') return json(403, { error: 'This form has expired.', code: 'csrf_invalid' });
      return json(201, { id: 7 });
    });
    vi.stubGlobal('fetch', fetchMock);
    const form = new FormData();
    form.append('label', 'Manifold photo');
    form.append('file', new Blob(['not really a png'], { type: 'image/png' }), 'manifold.png');

    await expect(api.post('/api/things/1/files', form)).resolves.toEqual({ id: 7 });

    const writes = calls(fetchMock).filter(([url]) => url === '/api/things/1/files');
    expect(writes).toHaveLength(2);
    for (const [, init] of writes) expect(headerOf(init, 'Content-Type')).toBeUndefined();
    expect(headerOf(writes[1]![1], 'X-CSRF-Token')).toBe('token-2');
    expect(bodies).toEqual([form, form]);
  });

  it('on 403 csrf_invalid fetches a fresh token and retries exactly once', async () => {
    let tokens = 0;
    const fetchMock = vi.fn(async (url: string, init: RequestInit) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: `token-${++tokens}` });
      if (headerOf(init, 'X-CSRF-Token') === 'token-1') return json(403, { error: 'Session token is stale.', code: 'csrf_invalid' });
      return json(201, { id: 7 });
    });
    vi.stubGlobal('fetch', fetchMock);

    await expect(api.post('/api/things', {})).resolves.toEqual({ id: 7 });
    const writes = calls(fetchMock).filter(([url]) => url === '/api/things');
    expect(writes.map(([, init]) => headerOf(init, 'X-CSRF-Token'))).toEqual(['token-1', 'token-2']);
  });

  it('does not loop when the retry is refused too, and reports the error', async () => {
    const fetchMock = vi.fn(async (url: string) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: 'always-stale' });
      return json(403, { error: 'Session token is stale.', code: 'csrf_invalid' });
    });
    vi.stubGlobal('fetch', fetchMock);

    const error = await api.post('/api/things', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 403, code: 'csrf_invalid' });
    expect(calls(fetchMock).filter(([url]) => url === '/api/things')).toHaveLength(2);
  });

  it('does not retry a 403 that is about roles', async () => {
    const fetchMock = vi.fn(async (url: string) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: 't' });
      return json(403, { error: 'Your roles do not allow this.', code: 'forbidden' });
    });
    vi.stubGlobal('fetch', fetchMock);
    await expect(api.post('/api/things', {})).rejects.toMatchObject({ code: 'forbidden' });
    expect(calls(fetchMock).filter(([url]) => url === '/api/things')).toHaveLength(1);
  });

  it('drops the token after a call that regenerates the session', async () => {
    let tokens = 0;
    const fetchMock = vi.fn(async (url: string) => {
      if (url === '/api/auth/csrf') return json(200, { csrfToken: `token-${++tokens}` });
      if (url === '/api/auth/login') return json(200, { id: 1, email: 'name@ternvalley.test', name: 'Rowan', roles: ['operator'] });
      return json(204);
    });
    vi.stubGlobal('fetch', fetchMock);

    await api.post('/api/auth/login', { email: 'name@ternvalley.test', password: 'x' }, { rotatesSession: true });
    await api.post('/api/profile/password', {});
    const [login, after] = [
      calls(fetchMock).find(([url]) => url === '/api/auth/login')!,
      calls(fetchMock).find(([url]) => url === '/api/profile/password')!,
    ];
    expect(headerOf(login[1], 'X-CSRF-Token')).toBe('token-1');
    expect(headerOf(after[1], 'X-CSRF-Token')).toBe('token-2');
  });

  it('turns the shared error shape into an ApiError with field details', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url === '/api/auth/csrf'
          ? json(200, { csrfToken: 't' })
          : json(400, { error: 'Some fields are not valid.', code: 'validation_failed', details: [{ path: 'email', message: 'Enter a valid e-mail address' }] }),
      ),
    );
    const error = (await api.post('/api/invitations', {}).catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation_failed');
    expect(error.message).toBe('Some fields are not valid.');
    expect(error.details).toEqual([{ path: 'email', message: 'Enter a valid e-mail address' }]);
  });

  it('reports an unreachable server as a network ApiError', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(api.get('/api/health')).rejects.toMatchObject({ status: 0, code: 'network' });
  });
});
