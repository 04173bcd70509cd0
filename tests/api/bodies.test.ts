import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation, User } from '../../server/models';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let admin: TestClient;
let operatorId: number;
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.client(DEMO.admin);
  operatorId = (await User.findOne({ where: { email: DEMO.pad } }))!.id;
});
afterAll(() => t.stop());

function raw(c: TestClient, method: 'post' | 'patch', url: string, body: string | Buffer, contentType = 'application/json') {
  return c.agent[method](url).set('X-CSRF-Token', c.csrf).set('Content-Type', contentType).send(body);
}

const BAD_JSON = { error: 'The request body is not valid JSON.', code: 'bad_json' };
const TOO_LARGE = { error: 'The request body is too large.', code: 'too_large' };

describe('request bodies', () => {
  it.each(['{"email": ', '{bad}', "{'email': 'x'}", 'null', '"a string"', '42', '{"a":1}}'])(
    'malformed or non-object JSON %j is 400 bad_json',
    async (body) => {
      const res = await raw(admin, 'post', '/api/invitations', body).expect(400);
      expect(res.body).toEqual(BAD_JSON);
    },
  );

  it('bad JSON is 400 bad_json even without a CSRF token or a session', async () => {
    const anon = await t.client();
    const res = await anon.agent.post('/api/auth/login').set('Content-Type', 'application/json').send('{oops').expect(400);
    expect(res.body).toEqual(BAD_JSON);
  });

  it('a body over 200 kB is 413 too_large and nothing is saved', async () => {
    const before = await Invitation.count();
    const big = JSON.stringify({ email: 'big@example.test', roles: ['operator'], pad: 'x'.repeat(210 * 1024) });
    const res = await raw(admin, 'post', '/api/invitations', big).expect(413);
    expect(res.body).toEqual(TOO_LARGE);
    expect(await Invitation.count()).toBe(before);

    const patch = await raw(admin, 'patch', `/api/users/${operatorId}`, JSON.stringify({ roles: ['admin'], pad: 'y'.repeat(250_000) })).expect(413);
    expect(patch.body).toEqual(TOO_LARGE);
    expect((await User.findByPk(operatorId))!.roles).toEqual(['operator']);
  });

  it('a body just under the limit is read (and then validated)', async () => {
    const body = JSON.stringify({ roles: ['operator'], pad: 'z'.repeat(190 * 1024) });
    const res = await raw(admin, 'patch', `/api/users/${operatorId}`, body).expect(400);
    expect(res.body.code).toBe('validation_failed');
  });

  it('an unsupported charset is 415, not a 500', async () => {
    const res = await raw(admin, 'post', '/api/invitations', '{}', 'application/json; charset=klingon').expect(415);
    expect(res.body.code).toBe('unsupported_encoding');
  });

  it('a non-JSON content type is treated as no body: 400 validation_failed', async () => {
    const res = await raw(admin, 'post', '/api/invitations', 'email=x@example.test&roles=admin', 'application/x-www-form-urlencoded').expect(400);
    expect(res.body.code).toBe('validation_failed');
  });

  it('JSON arrays and prototype keys are refused with 400', async () => {
    const arr = await raw(admin, 'post', '/api/invitations', '[{"email":"x@example.test","roles":["admin"]}]').expect(400);
    expect(arr.body.code).toBe('validation_failed');
    const proto = await raw(admin, 'patch', `/api/users/${operatorId}`, '{"__proto__":{"roles":["admin"]},"active":true}');
    expect(proto.status).toBe(400);
    expect((await User.findByPk(operatorId))!.roles).toEqual(['operator']);
    const ctor = await raw(admin, 'patch', `/api/users/${operatorId}`, '{"constructor":{"prototype":{"x":1}},"active":true}');
    expect(ctor.status).toBe(400);
  });

  const routes: ['post' | 'patch', string][] = [
    ['post', '/api/auth/login'],
    ['post', '/api/setup'],
    ['post', '/api/invitations'],
    ['post', '/api/invitations/accept'],
    ['post', '/api/password-resets'],
    ['post', '/api/password-resets/complete'],
    ['patch', '/api/profile'],
    ['post', '/api/profile/password'],
    ['patch', '/api/users/1'],
  ];
  const nasty = [
    '{',
    '[]',
    '{}',
    '{"email":null,"password":null,"roles":null,"name":null,"token":null}',
    '{"email":{"$gt":""},"password":{"$ne":null}}',
    '{"email":["a@b.test"],"roles":[["admin"]],"token":123,"name":{}}',
    JSON.stringify({ email: 'e'.repeat(5000) + '@x.test', password: 'p'.repeat(5000), token: 't'.repeat(5000), name: 'n'.repeat(5000) }),
  ];
  it.each(routes)('%s %s never answers 500 to strange bodies', async (method, url) => {
    for (const body of nasty) {
      const res = await raw(admin, method, url, body);
      expect(res.status, `${method} ${url} ${body.slice(0, 60)}`).toBeGreaterThanOrEqual(400);
      expect(res.status, `${method} ${url} ${body.slice(0, 60)}`).toBeLessThan(500);
      expect(typeof res.body.code).toBe('string');
    }
    // The admin is still the admin after all that.
    expect((await admin.get('/api/auth/me').expect(200)).body.roles).toEqual(['admin']);
  });
});
