import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { TextAreaField } from '../../../components/ui/SelectField';
import { stationCodeSchema, stationInputSchema, type StationDto } from '../../../contract/procedures';
import { ApiError, errorMessage, isApiError } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useSignedInMe } from '../../../lib/session';
import { useCreateStation } from '../api/createStation';
import { useDeleteStation } from '../api/deleteStation';
import { useStations } from '../api/listStations';
import { useUpdateStation } from '../api/updateStation';
import { canEditStations } from '../lib/format';
import { ProceduresNav } from './ProceduresNav';

/** The contract's fields, with the PPE list written one item a line. */
const stationFormSchema = z.object({
  code: stationCodeSchema,
  name: stationInputSchema.shape.name,
  callSign: stationInputSchema.shape.callSign,
  ppe: z.string().max(6500, 'Use at most 6500 characters'),
});
type StationFormValues = z.input<typeof stationFormSchema>;
const FIELDS = ['code', 'name', 'callSign', 'ppe'] as const;

const ppeLines = (text: string) =>
  text
    .split('\n')
    .map((s) => s.trim())
    .filter(Boolean);

/** The server names PPE items 'defaultPpe.N'; the form has them in one box. */
function onPpeField(error: unknown): unknown {
  if (!isApiError(error)) return error;
  const details = error.details.map((d) => {
    const m = /^defaultPpe(?:\.(\d+))?/.exec(d.path);
    return m ? { path: 'ppe', message: m[1] !== undefined ? `Line ${Number(m[1]) + 1}: ${d.message}` : d.message } : d;
  });
  return new ApiError(error.status, error.code, error.message, details);
}

export function StationsPage() {
  const me = useSignedInMe();
  const canEdit = canEditStations(me.roles);
  const stations = useStations();
  const [adding, setAdding] = useState(false);

  return (
    <Page
      title="Stations"
      kicker="Procedures"
      actions={
        canEdit && !adding ? (
          <Button variant="primary" onClick={() => setAdding(true)}>
            Add a station
          </Button>
        ) : null
      }
    >
      <ProceduresNav />
      <p className="mb-5 max-w-prose">
        The team’s stations: who is responsible for a step, who answers a go/no-go poll. Steps name a station by its short code, so a code in
        use stays as it is.
      </p>
      {adding ? (
        <Section title="New station" className="mb-6">
          <StationForm onDone={() => setAdding(false)} />
        </Section>
      ) : null}
      {stations.isPending ? <Loading label="Loading stations…" /> : null}
      {stations.isError ? (
        <Notice tone="danger" title="Could not load the stations">
          <p>{errorMessage(stations.error)}</p>
        </Notice>
      ) : null}
      {stations.data ? (
        stations.data.length === 0 ? (
          <p>No stations yet.</p>
        ) : (
          <ul className="grid gap-4 lg:grid-cols-2" aria-label="Stations">
            {stations.data.map((s) => (
              <StationCard key={s.id} station={s} canEdit={canEdit} />
            ))}
          </ul>
        )
      ) : null}
    </Page>
  );
}

function StationCard({ station: s, canEdit }: { station: StationDto; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteStation();
  return (
    <li className="flex min-w-0 flex-col gap-3 rounded-md border-2 border-line bg-surface p-4">
      {editing ? (
        <>
          <h2 className="text-xl font-bold">Edit {s.code}</h2>
          <StationForm station={s} onDone={() => setEditing(false)} />
        </>
      ) : (
        <>
          <h2 className="flex flex-wrap items-baseline gap-x-3 text-xl font-bold">
            <span className="rounded-sm border-2 border-line px-2 font-mono">{s.code}</span>
            <span>{s.name}</span>
          </h2>
          <dl className="grid gap-x-3 gap-y-1 sm:grid-cols-[max-content_minmax(0,1fr)]">
            <dt className="font-bold">Call sign</dt>
            <dd>“{s.callSign}”</dd>
            <dt className="font-bold">Default PPE</dt>
            <dd className="min-w-0">
              {s.defaultPpe.length ? (
                <ul className="list-disc pl-5">
                  {s.defaultPpe.map((item) => (
                    <li key={item}>{item}</li>
                  ))}
                </ul>
              ) : (
                'None listed'
              )}
            </dd>
          </dl>
          {canEdit ? (
            <div className="flex flex-wrap gap-2">
              <Button onClick={() => setEditing(true)}>
                Edit <span className="sr-only">{s.code}</span>
              </Button>
              {confirming ? (
                <>
                  <Button variant="danger" pending={remove.isPending} pendingLabel="Deleting…" onClick={() => remove.mutate(s.id)}>
                    Delete {s.code}
                  </Button>
                  <Button
                    variant="quiet"
                    onClick={() => {
                      setConfirming(false);
                      remove.reset();
                    }}
                  >
                    Keep it
                  </Button>
                </>
              ) : (
                <Button variant="quiet" onClick={() => setConfirming(true)}>
                  Delete <span className="sr-only">{s.code}</span>
                </Button>
              )}
            </div>
          ) : null}
          {remove.isError ? (
            <Notice tone="danger" title="Not deleted">
              <p>{errorMessage(remove.error)}</p>
            </Notice>
          ) : null}
        </>
      )}
    </li>
  );
}

function StationForm({ station, onDone }: { station?: StationDto; onDone: () => void }) {
  const create = useCreateStation();
  const update = useUpdateStation();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<StationFormValues>({
    resolver: zodResolver(stationFormSchema),
    defaultValues: { code: station?.code ?? '', name: station?.name ?? '', callSign: station?.callSign ?? '', ppe: station?.defaultPpe.join('\n') ?? '' },
  });
  const { register, handleSubmit, setError, formState } = form;
  const e = formState.errors;
  const submit = handleSubmit(async (v) => {
    setFormError(null);
    const input = { code: v.code, name: v.name, callSign: v.callSign, defaultPpe: ppeLines(v.ppe) };
    try {
      if (station) await update.mutateAsync({ id: station.id, input });
      else await create.mutateAsync(input);
      onDone();
    } catch (error) {
      setFormError(applyServerError(onPpeField(error), setError, FIELDS, { station_code_taken: 'code', station_in_use: 'code' }));
    }
  });
  return (
    <Form onSubmit={(event) => void submit(event)} aria-label={station ? `Edit station ${station.code}` : 'New station'}>
      <FormError title="Not saved" message={formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Short code" hint="2 to 8 capital letters or digits, like PROP." autoCapitalize="characters" error={e.code?.message} {...register('code')} />
        <TextField label="Call sign" hint="What the station is called on the net." error={e.callSign?.message} {...register('callSign')} />
      </div>
      <TextField label="Name" error={e.name?.message} {...register('name')} />
      <TextAreaField label="Default PPE" hint="One item a line." error={e.ppe?.message} {...register('ppe')} />
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Saving…">
          {station ? 'Save station' : 'Add station'}
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}
