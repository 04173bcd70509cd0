import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { EvidenceDto, HazardDto } from '../../src/contract/hazards';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { describeCalcEvidence } from '../../src/features/hazards/lib/calcEvidence';
import { fakeApi, headerOf, json } from './fake-api';
import { hazard } from './hazards-fixtures';
import { renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const safety = { id: 3, email: 'safety@ternvalley.test', name: 'Mara Oduya', roles: ['safety'] };
const auditor = { id: 5, email: 'audit@ternvalley.test', name: 'Theo Brandt', roles: ['auditor'] };
const operator = { id: 2, email: 'pad@ternvalley.test', name: 'Rowan Fenn', roles: ['operator'] };

const photo: EvidenceDto = {
  id: 31,
  kind: 'file',
  label: 'Burst disc fitted, serial visible',
  data: {},
  file: { id: 7, name: 'burst-disc.png', mediaType: 'image/png', sizeBytes: 48_213, sha256: 'a'.repeat(64), url: '/api/uploads/7', uploadedAt: '2026-03-04T10:00:00.000Z' },
  addedBy: 'Mara Oduya',
  createdAt: '2026-03-04T10:00:00.000Z',
};
const report: EvidenceDto = {
  id: 32,
  kind: 'file',
  label: 'Proof test report',
  data: {},
  file: { id: 8, name: 'proof-test.pdf', mediaType: 'application/pdf', sizeBytes: 1_234_567, sha256: 'b'.repeat(64), url: '/api/uploads/8', uploadedAt: '2026-03-04T11:00:00.000Z' },
  addedBy: 'Mara Oduya',
  createdAt: '2026-03-04T11:00:00.000Z',
};
// Outputs as the server froze them: 789.3 kg/m³ × 1162 m/s × 2.2 m/s = 2 017 766 Pa.
const surge: EvidenceDto = {
  id: 33,
  kind: 'calc',
  label: 'Joukowsky surge at 2.2 m/s',
  data: {
    calc: 'surge',
    inputs: { fluid: 'ethanol', velocityChangeMps: 2.2 },
    outputs: { deltaPressurePa: 2017766.28, waveSpeedMps: 1162, regime: 'instantaneous', sources: ['Joukowsky (1900)'], cautions: ['Check against the governing code.'] },
    computedAt: '2026-03-05T09:00:00.000Z',
  },
  file: null,
  addedBy: 'Mara Oduya',
  createdAt: '2026-03-05T09:00:00.000Z',
};

const mit = (evidence: EvidenceDto[]) => ({
  id: 12,
  kind: 'engineered-feature' as const,
  description: 'Burst disc on the fuel manifold',
  owner: 'Ines Kovac',
  verificationMethod: 'Proof test',
  verificationStatus: 'verified' as const,
  evidence,
});
const withEvidence = (evidence: EvidenceDto[]): HazardDto => hazard({ id: 1, title: 'Fuel surge at main-valve opening', mitigations: [mit(evidence)] });

/** The hazard as the server holds it: a write answers with the new hazard and later reads return that. */
let current: HazardDto;
const saved = (h: HazardDto, status = 200) => {
  current = h;
  return json(status, h);
};

function server(me: object, h: HazardDto, extra: Parameters<typeof fakeApi>[0] = {}) {
  current = h;
  return fakeApi({
    'GET /api/auth/me': json(200, me),
    'GET /api/setup': setup,
    'GET /api/auth/csrf': json(200, { csrfToken: 'csrf-1' }),
    'GET /api/hazards/1': () => json(200, current),
    'GET /api/hazards/1/history': json(200, []),
    'GET /api/hazards': () => json(200, [current]),
    ...extra,
  });
}

afterEach(() => vi.restoreAllMocks());

describe('mitigation evidence', () => {
  it('shows a photo thumbnail, a file line and a frozen calculation in words', async () => {
    server(auditor, withEvidence([photo, report, surge]));
    renderApp('/hazards/1');
    const list = await screen.findByRole('list', { name: 'Evidence' });
    const img = within(list).getByRole('img', { name: 'Photo: Burst disc fitted, serial visible' });
    expect(img).toHaveAttribute('src', '/api/uploads/7');
    expect(within(list).getByText(/PNG, 48 kB/)).toBeInTheDocument();
    expect(within(list).getByText(/PDF, 1\.2 MB/)).toBeInTheDocument();
    const download = within(list).getByRole('link', { name: 'Download proof-test.pdf' });
    expect(download).toHaveAttribute('href', '/api/uploads/8');
    expect(download).toHaveAttribute('download', 'proof-test.pdf');

    const calc = within(list).getByText('Joukowsky surge at 2.2 m/s').closest('li')!;
    expect(within(calc).getByText(/Frozen result of the valve surge \(water hammer\) check/)).toBeInTheDocument();
    expect(within(calc).getByText('Ethanol, 20 C')).toBeInTheDocument();
    expect(within(calc).getByText('2.2 m/s')).toBeInTheDocument();
    expect(within(calc).getByText('2.02 MPa (20.2 bar)')).toBeInTheDocument();
    expect(within(calc).getByText('Instantaneous (worst case)')).toBeInTheDocument();
    expect(calc.textContent).not.toMatch(/[{}]|deltaPressurePa/);

    // Readers see it all and can change none of it.
    expect(screen.queryByRole('button', { name: /Add a file/ })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Remove evidence/ })).not.toBeInTheDocument();
  });

  it('uploads a file as multipart with the CSRF header and shows the new evidence', async () => {
    const user = userEvent.setup();
    let sent: FormData | undefined;
    let csrf: string | undefined;
    server(safety, withEvidence([]), {
      'POST /api/hazards/1/mitigations/12/evidence/files': (init) => {
        sent = init.body as FormData;
        csrf = headerOf(init, 'X-CSRF-Token');
        return saved(withEvidence([photo]), 201);
      },
    });
    renderApp('/hazards/1');
    await user.click(await screen.findByRole('button', { name: 'Add a file as evidence for: Burst disc on the fuel manifold' }));
    const form = screen.getByRole('form', { name: /Add a file as evidence for/ });
    const input = within(form).getByLabelText('File');
    expect(within(form).getByText(/PNG, JPEG, WebP, GIF, PDF, plain text or CSV; up to 10 MB\./)).toBeInTheDocument();
    expect(input).toHaveAttribute('accept', expect.stringContaining('image/png'));
    const file = new File([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], 'burst-disc.png', { type: 'image/png' });
    await user.upload(input, file);
    await user.type(within(form).getByLabelText('Label (optional)'), 'Burst disc fitted, serial visible');
    await user.click(within(form).getByRole('button', { name: 'Upload file' }));

    expect(await screen.findByText('Added “Burst disc fitted, serial visible”.')).toBeInTheDocument();
    expect(csrf).toBe('csrf-1');
    expect(sent).toBeInstanceOf(FormData);
    expect((sent!.get('file') as File).name).toBe('burst-disc.png');
    expect(sent!.get('label')).toBe('Burst disc fitted, serial visible');
    expect(screen.getByRole('img', { name: 'Photo: Burst disc fitted, serial visible' })).toBeInTheDocument();
    expect(screen.queryByRole('form', { name: /Add a file as evidence for/ })).not.toBeInTheDocument();
  });

  it('refuses a file over the limit before sending, and shows the server refusing a type under the field', async () => {
    const user = userEvent.setup();
    const post = vi.fn(() => json(415, { error: 'This file is not one Holdfire accepts.', code: 'file_type_not_allowed', details: [{ path: 'file', message: 'Not an accepted file type.' }] }));
    server(safety, withEvidence([]), { 'POST /api/hazards/1/mitigations/12/evidence/files': post });
    renderApp('/hazards/1');
    await user.click(await screen.findByRole('button', { name: /Add a file as evidence for/ }));
    const form = screen.getByRole('form', { name: /Add a file as evidence for/ });
    const input = within(form).getByLabelText('File');

    await user.click(within(form).getByRole('button', { name: 'Upload file' }));
    expect(within(form).getByText('Choose a file to upload.')).toBeInTheDocument();

    await user.upload(input, new File([new Uint8Array(UPLOAD_MAX_BYTES + 1)], 'huge.png', { type: 'image/png' }));
    await user.click(within(form).getByRole('button', { name: 'Upload file' }));
    expect(within(form).getByText('That file is 10.0 MB, more than the 10 MB limit.')).toBeInTheDocument();
    expect(post).not.toHaveBeenCalled();

    await user.upload(input, new File(['<html></html>'], 'page.png', { type: 'image/png' }));
    await user.click(within(form).getByRole('button', { name: 'Upload file' }));
    expect(await within(form).findByText('This file is not one Holdfire accepts.')).toBeInTheDocument();
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(post).toHaveBeenCalledTimes(1);
  });

  it('removes evidence only after a confirm', async () => {
    const user = userEvent.setup();
    const del = vi.fn(() => saved(withEvidence([])));
    server(safety, withEvidence([photo]), { 'DELETE /api/hazards/1/evidence/31': del });
    renderApp('/hazards/1');
    const remove = await screen.findByRole('button', { name: 'Remove evidence: Burst disc fitted, serial visible' });
    const confirm = vi.spyOn(window, 'confirm').mockReturnValueOnce(false).mockReturnValueOnce(true);
    await user.click(remove);
    expect(del).not.toHaveBeenCalled();
    await user.click(remove);
    await waitFor(() => expect(del).toHaveBeenCalledTimes(1));
    expect(confirm.mock.calls[0]![0]).toMatch(/The file is deleted from Holdfire; the history keeps its name and checksum/);
    expect(await screen.findByText('No evidence attached yet.')).toBeInTheDocument();
  });
});

describe('attaching a calculation from the checks page', () => {
  const surgeResult = { deltaPressurePa: 5415000, waveSpeedMps: 950, regime: 'instantaneous', sources: ['Joukowsky (1900)'], cautions: ['Check against the governing code.'] };

  it('lets a safety officer freeze a result on a chosen mitigation and links to the hazard', async () => {
    const user = userEvent.setup();
    let body: unknown;
    const h = withEvidence([]);
    server(safety, h, {
      'GET /api/calc/surge?fluid=lox&velocityChangeMps=5': json(200, surgeResult),
      'POST /api/hazards/1/evidence': (init) => {
        body = JSON.parse(String(init.body));
        return saved(withEvidence([surge]), 201);
      },
    });
    renderApp('/hazards/tools');
    const card = (await screen.findByRole('form', { name: 'Valve surge (water hammer)' })).closest('section')!;
    await user.click(within(card).getByRole('button', { name: 'Calculate' }));
    await user.click(await within(card).findByRole('button', { name: 'Attach this result to a hazard' }));
    const form = await within(card).findByRole('form', { name: 'Attach the valve surge (water hammer) result to a hazard' });
    const mitigation = within(form).getByLabelText('Mitigation');
    expect(mitigation).toBeDisabled();
    await user.selectOptions(within(form).getByLabelText('Hazard'), 'HZ-001 Fuel surge at main-valve opening');
    await user.selectOptions(mitigation, '3. Burst disc on the fuel manifold');
    await user.click(within(form).getByRole('button', { name: 'Attach result' }));

    const done = await within(card).findByRole('status');
    expect(done).toHaveTextContent('Result attached');
    expect(within(done).getByRole('link', { name: 'HZ-001 Fuel surge at main-valve opening' })).toHaveAttribute('href', '/hazards/1');
    expect(body).toEqual({ mitigationId: 12, calc: 'surge', inputs: { fluid: 'lox', velocityChangeMps: 5 }, label: 'Valve surge (water hammer)' });
  });

  it('asks for a hazard and a mitigation before sending', async () => {
    const user = userEvent.setup();
    const post = vi.fn(() => json(201, withEvidence([])));
    server(safety, withEvidence([]), { 'GET /api/calc/surge?fluid=lox&velocityChangeMps=5': json(200, surgeResult), 'POST /api/hazards/1/evidence': post });
    renderApp('/hazards/tools');
    const card = (await screen.findByRole('form', { name: 'Valve surge (water hammer)' })).closest('section')!;
    await user.click(within(card).getByRole('button', { name: 'Calculate' }));
    await user.click(await within(card).findByRole('button', { name: 'Attach this result to a hazard' }));
    await user.click(await within(card).findByRole('button', { name: 'Attach result' }));
    expect(within(card).getByText('Choose the hazard to attach the result to.')).toBeInTheDocument();
    expect(post).not.toHaveBeenCalled();
  });

  it('is not offered to an operator', async () => {
    const user = userEvent.setup();
    server(operator, withEvidence([]), { 'GET /api/calc/surge?fluid=lox&velocityChangeMps=5': json(200, surgeResult) });
    renderApp('/hazards/tools');
    const card = (await screen.findByRole('form', { name: 'Valve surge (water hammer)' })).closest('section')!;
    await user.click(within(card).getByRole('button', { name: 'Calculate' }));
    expect(await within(card).findByText('5.42 MPa (54.2 bar)')).toBeInTheDocument();
    expect(within(card).queryByRole('button', { name: /Attach/ })).not.toBeInTheDocument();
  });
});

describe('describeCalcEvidence', () => {
  it('names every input with its unit and keeps unknown fields readable', () => {
    const d = describeCalcEvidence({
      calc: 'quantity-distance',
      inputs: { propellantKg: 20, combination: 'lox-alcohol', setting: 'static-test-stand', futureField: 3 },
      outputs: { tntKg: 2, tntPercentUsed: 10, distancesM: { inhabitedBuilding: 20.0, publicTrafficRoute: 12, intralineUnbarricaded: 9, intralineBarricaded: 4.5 }, sources: ['DoD 6055.09-M'], cautions: [] },
      computedAt: '2026-03-05T09:00:00.000Z',
    });
    expect(d.title).toBe('Quantity-distance (blast)');
    expect(d.inputs).toEqual([
      { label: 'Total propellant mass', value: '20 kg' },
      { label: 'Propellant combination', value: 'LOX / alcohol' },
      { label: 'Setting', value: 'Static test stand' },
      { label: 'Future Field', value: '3' },
    ]);
    expect(d.outputs[0]).toEqual({ label: 'TNT equivalent', value: '2.00 kg (10.0 % of propellant)' });
    expect(d.outputs).toContainEqual({ label: 'Inhabited building distance (1.2 psi)', value: '20.0 m' });
    expect(d.sources).toEqual(['DoD 6055.09-M']);
  });
});
