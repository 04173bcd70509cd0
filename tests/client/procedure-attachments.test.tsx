import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { RevisionDto } from '../../src/contract/procedures';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { AttachmentUploadForm } from '../../src/features/procedures/components/Attachments';
import { fakeApi, json } from './fake-api';

afterEach(() => vi.unstubAllGlobals());

const step = (key: string, instruction: string, tSeconds: number | null) => ({
  key,
  kind: 'action' as const,
  tSeconds,
  t: null,
  station: 'PROP',
  instruction,
  hazardIds: [],
  propellants: [],
  note: '',
  cautions: [],
});

const draft = {
  id: 4,
  procedureId: 2,
  number: 1,
  status: 'draft',
  basedOn: null,
  phases: [{ key: 'p-1', name: 'Loading', steps: [step('s-fill', 'Fill the LOX run tank at low flow.', -2700), step('s-vent', 'Close the vent valve.', null)] }],
  signoffs: [],
  releasedAt: null,
  countable: false,
  notCountableReason: 'A draft cannot be counted.',
  cautionsChangedSinceRelease: false,
  neededStations: ['PROP'],
  attachments: [],
  createdAt: '2026-03-04T10:00:00.000Z',
  updatedAt: '2026-03-04T10:00:00.000Z',
} as unknown as RevisionDto;

function renderForm() {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const onDone = vi.fn();
  render(
    <QueryClientProvider client={client}>
      <AttachmentUploadForm revision={draft} onDone={onDone} onCancel={() => {}} />
    </QueryClientProvider>,
  );
  return { onDone, form: screen.getByRole('form', { name: 'Attach a diagram or photo' }) };
}

describe('attaching a file to a procedure draft', () => {
  it('offers the whole procedure or each step, checks the file before sending, and shows the server refusal at the file', async () => {
    const user = userEvent.setup();
    const post = vi.fn(() => json(415, { error: 'This file is not one Holdfire accepts.', code: 'file_type_not_allowed', details: [{ path: 'file', message: 'Not an accepted file type.' }] }));
    fakeApi({ 'GET /api/auth/csrf': json(200, { csrfToken: 'csrf-1' }), 'POST /api/procedures/2/revisions/1/attachments': post });
    const { form, onDone } = renderForm();

    const target = within(form).getByLabelText('Attach to');
    expect(within(target).getAllByRole('option').map((o) => o.textContent)).toEqual([
      'The whole procedure',
      'Step 1 · T-45:00 · Fill the LOX run tank at low flow.',
      'Step 2 · untimed · Close the vent valve.',
    ]);

    await user.click(within(form).getByRole('button', { name: 'Attach file' }));
    expect(within(form).getByText('Choose a file to upload.')).toBeInTheDocument();

    const input = within(form).getByLabelText('File');
    await user.upload(input, new File([new Uint8Array(UPLOAD_MAX_BYTES + 1)], 'huge.png', { type: 'image/png' }));
    await user.click(within(form).getByRole('button', { name: 'Attach file' }));
    expect(within(form).getByText('That file is 10.0 MB, more than the 10 MB limit.')).toBeInTheDocument();
    expect(post).not.toHaveBeenCalled();

    await user.upload(input, new File(['not a picture'], 'valve.png', { type: 'image/png' }));
    await user.selectOptions(target, 's-vent');
    await user.click(within(form).getByRole('button', { name: 'Attach file' }));
    expect(await within(form).findByText('This file is not one Holdfire accepts.')).toBeInTheDocument();
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(post).toHaveBeenCalledTimes(1);
    const body = (post.mock.calls[0] as unknown as [RequestInit])[0].body as FormData;
    expect(body.get('stepKey')).toBe('s-vent');
    expect((body.get('file') as File).name).toBe('valve.png');
    expect(onDone).not.toHaveBeenCalled();
  });
});
