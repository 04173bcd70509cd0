// @vitest-environment jsdom
import '../setup-dom';
import { screen, waitFor } from '@testing-library/react';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { DEMO } from '../helpers/api';
import { renderApp } from '../client/render-app';
import { caller, startSecurityApp, type Caller } from './support';

/**
 * Stored XSS: markup, scripts and `javascript:` links saved through the real API in the free-text fields of
 * hazards, mitigations, procedures, counts, anomalies and their corrective actions, stations, crew plans and people's
 * names, then shown by the real client pages
 * (jsdom, with fetch going to the real server as the signed-in person). The text must appear as text, and no
 * element, handler or script may come of it.
 */
const t = await startSecurityApp();
afterAll(() => t.stop());

const MARK = 'Zq7';
const PAYLOADS = [
  `${MARK}<img src=x onerror="window.__xss='img'">`,
  `${MARK}<script>window.__xss='script'</script>`,
  `${MARK}javascript:window.__xss='link'`,
  `${MARK}"><svg onload="window.__xss='svg'">`,
  `${MARK}<a href="javascript:window.__xss='a'">go</a>`,
];
/** Each field gets its own tag, so a page is checked only once every field it shows has arrived. */
const payload = (i: number, field: string) => PAYLOADS[i % PAYLOADS.length]!.replace(MARK, `${MARK}[${field}]`);

let safety: Caller;
let admin: Caller;
const ids: Record<string, number> = {};

async function write(c: Caller, method: 'post' | 'patch' | 'put', url: string, body: object, status?: number) {
  const res = await c.agent[method](url).set('X-CSRF-Token', c.csrf).send(body);
  if (status !== undefined) expect(res.status, `${method} ${url} ${JSON.stringify(res.body)}`).toBe(status);
  else expect(res.status, `${method} ${url} ${JSON.stringify(res.body)}`).toBeLessThan(300);
  return res.body;
}

beforeAll(async () => {
  safety = await caller(t, DEMO.safety);
  admin = await caller(t, DEMO.admin);
  const conductor = await caller(t, DEMO.conductor);
  // A person's name shows beside everything they do.
  await write(safety, 'patch', '/api/profile', { name: payload(0, 'name') });
  const hazard = await write(safety, 'post', '/api/hazards', {
    title: payload(1, 'title'),
    system: 'feed-system',
    phase: 'propellant-loading',
    description: payload(4, 'description'),
    causes: [payload(0, 'causes')],
    effects: [payload(1, 'effects')],
    initialSeverity: '2',
    initialLikelihood: 'C',
  });
  ids.hazard = hazard.id;
  await write(safety, 'post', `/api/hazards/${ids.hazard}/mitigations`, { kind: 'engineered-feature', description: payload(2, 'mitigation'), owner: payload(3, 'owner'), verificationMethod: payload(4, 'verificationMethod') });
  const procedure = await write(conductor, 'post', '/api/procedures', { name: payload(1, 'procName'), purpose: payload(2, 'purpose'), testArticle: payload(3, 'testArticle'), site: payload(4, 'site') });
  ids.procedure = procedure.id;
  await write(conductor, 'put', `/api/procedures/${procedure.id}/revisions/1`, {
    phases: [
      {
        name: payload(0, 'phaseName'),
        steps: [
          { kind: 'action', tSeconds: -15, station: 'TC', instruction: payload(1, 'instruction') },
          { kind: 'reading', tSeconds: -14, station: 'PROP', instruction: payload(2, 'readingName'), unit: 'bar', min: null, max: 14 },
        ],
      },
    ],
  });
  const anomaly = await write(safety, 'post', '/api/anomalies', { title: payload(3, 'anomalyTitle'), description: payload(4, 'anomalyDescription'), severity: '2', immediateActions: payload(0, 'immediateActions') });
  ids.anomaly = anomaly.id;
  const me = await safety.agent.get('/api/auth/me').expect(200);
  const ownerId = (me.body.user ?? me.body).id as number;
  await write(safety, 'post', `/api/anomalies/${ids.anomaly}/actions`, { description: payload(1, 'actionText'), ownerId, dueDate: '2027-01-15' });
  const p1 = await conductor.agent.get('/api/procedures/1').expect(200);
  const released = (p1.body.revisions as { id: number; status: string }[]).find((r) => r.status === 'released')!;
  const count = await write(conductor, 'post', '/api/counts', { procedureId: 1, revisionId: released.id, name: payload(2, 'countName') });
  ids.count = count.id;
  // Stations and crew plans: their names show in the count screens and the crew planner.
  const station = await write(conductor, 'post', '/api/stations', { code: 'XSS1', name: payload(3, 'stationName'), callSign: `${MARK}[callSign]<i onclick=1>`, defaultPpe: [payload(0, 'ppe')] });
  await write(conductor, 'post', '/api/crew-plans', {
    name: payload(1, 'crewName'),
    procedureId: ids.procedure,
    notes: payload(2, 'crewNotes'),
    assignments: [{ stationId: station.id, userId: ownerId }],
  });
});

/** The client's fetch, sent to the real server with the signed-in session's cookie. */
function realApi(c: Caller) {
  vi.stubGlobal('fetch', async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.pathname + input.search : input.url;
    const headers = new Headers(init.headers);
    headers.set('cookie', c.cookie);
    return nodeFetch(`${t.url}${url}`, { ...init, headers });
  });
}
const nodeFetch = globalThis.fetch;

/** Nothing made from user text: no injected elements, handlers, script URLs, and no script ran. */
function expectInert() {
  const w = window as unknown as { __xss?: string };
  expect(w.__xss).toBeUndefined();
  expect(document.querySelectorAll('script, iframe, object, embed, svg[onload], img[src="x"]')).toHaveLength(0);
  for (const el of document.querySelectorAll('*')) {
    for (const attr of el.getAttributeNames()) {
      expect(attr.startsWith('on'), `${el.tagName} has ${attr}`).toBe(false);
    }
    const href = el.getAttribute('href') ?? el.getAttribute('src') ?? '';
    expect(href.trim().toLowerCase().startsWith('javascript:'), `${el.tagName} ${href}`).toBe(false);
  }
}

/** What a person sees: the page's text and the values in its fields. */
const visibleText = () =>
  `${document.body.textContent} ${[...document.querySelectorAll('input, textarea')].map((e) => (e as HTMLInputElement).value).join(' ')}`;

async function showsPayloadText(fields: readonly string[]) {
  await waitFor(() => {
    for (const f of fields) expect(visibleText()).toContain(`${MARK}[${f}]`);
  }, { timeout: 8000 });
  // The stored markup is visible as characters.
  expect(visibleText()).toMatch(/Zq7\[\w+\](<img src=x|<script>|javascript:|"><svg|<a href=)/);
}

describe('stored text is shown as text', () => {
  const pages: [string, () => string, 'safety' | 'admin', string[]][] = [
    ['hazard register', () => '/hazards', 'safety', ['title']],
    ['hazard detail', () => `/hazards/${ids.hazard}`, 'safety', ['title', 'description', 'causes', 'effects', 'mitigation', 'owner']],
    ['procedure list', () => '/procedures', 'safety', ['procName']],
    ['procedure', () => `/procedures/${ids.procedure}`, 'safety', ['procName', 'purpose', 'testArticle', 'site']],
    ['procedure revision (steps)', () => `/procedures/${ids.procedure}/revisions/1`, 'safety', ['phaseName', 'instruction', 'readingName']],
    ['count list', () => '/counts', 'safety', ['countName']],
    ['anomaly list', () => '/anomalies', 'safety', ['anomalyTitle']],
    ['anomaly detail', () => `/anomalies/${ids.anomaly}`, 'safety', ['anomalyTitle', 'anomalyDescription', 'immediateActions', 'actionText']],
    ['stations', () => '/procedures/stations', 'safety', ['stationName', 'callSign', 'ppe']],
    ['crew plans', () => `/procedures/${ids.procedure}/crew`, 'safety', ['crewName', 'stationName']],
    ['count report', () => `/counts/${ids.count}/report`, 'safety', ['countName']],
    ['people (admin)', () => '/admin/people', 'admin', ['name']],
    ['profile', () => '/profile', 'safety', ['name']],
  ];

  it.each(pages)('%s renders stored markup inertly', async (_name, pathOf, whoKey, fields) => {
    const path = pathOf();
    realApi(whoKey === 'admin' ? admin : safety);
    renderApp(path);
    await showsPayloadText(fields);
    expectInert();
    expect(screen.queryByText(/Something went wrong/)).toBeNull();
  });
});
