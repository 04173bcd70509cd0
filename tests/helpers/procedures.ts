import type { TestClient } from './app';

export const put = (c: TestClient, url: string, body: object = {}) => c.agent.put(url).set('X-CSRF-Token', c.csrf).send(body);
export const del = (c: TestClient, url: string) => c.agent.delete(url).set('X-CSRF-Token', c.csrf);

/** A short, valid procedure using the demo team's stations; `hazardId` is linked to the loading step. */
export function sampleContent(hazardId?: number) {
  return {
    phases: [
      {
        name: 'Leak checks',
        steps: [
          { kind: 'action', tSeconds: -3600, station: 'PAD', instruction: 'Connect the GN2 bottle; open it slowly.', propellants: ['gn2'] },
          { kind: 'reading', tSeconds: null, station: 'PAD', instruction: 'Bottle pressure.', unit: 'bar', min: 200, max: 300 },
          { kind: 'poll', tSeconds: -3000, station: 'TC', instruction: 'Go for loading?', stations: ['PAD', 'SAFE'] },
        ],
      },
      {
        name: 'Loading',
        steps: [
          { kind: 'personnelCheck', tSeconds: -2900, station: 'SAFE', instruction: 'Only the loading crew at the stand.', checks: ['keep-out-clear', 'head-count'] },
          { kind: 'action', tSeconds: -2700, station: 'PROP', instruction: 'Fill the LOX run tank at low flow.', propellants: ['lox'], hazardIds: hazardId ? [hazardId] : [] },
          { kind: 'builtInHold', tSeconds: -1800, station: 'TC', instruction: 'Built-in hold.', durationSeconds: 600 },
        ],
      },
    ],
  };
}

export async function createProcedure(c: TestClient, name = 'Test procedure'): Promise<{ id: number }> {
  const res = await c.post('/api/procedures', { name, purpose: 'For a test.', testArticle: 'Kestrel-2', site: 'Marsh End test site' });
  if (res.status !== 201) throw new Error(`create procedure: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}
