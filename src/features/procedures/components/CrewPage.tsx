import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Link, useParams } from 'react-router-dom';
import { z } from 'zod';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { TextAreaField } from '../../../components/ui/SelectField';
import { crewPlanInputSchema, type CrewPersonDto, type CrewPlanDto, type ProcedureDto, type StationDto } from '../../../contract/procedures';
import { format, parseISO } from 'date-fns';
import { errorMessage } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useSignedInMe } from '../../../lib/session';
import { useDeleteCrewPlan } from '../api/deleteCrewPlan';
import { useProcedure } from '../api/getProcedure';
import { useManning } from '../api/getManning';
import { useRevision } from '../api/getRevision';
import { useCrewPeople } from '../api/listCrewPeople';
import { useCrewPlans } from '../api/listCrewPlans';
import { useStations } from '../api/listStations';
import { useSaveCrewPlan } from '../api/saveCrewPlan';
import { canEditStations, idParam } from '../lib/format';
import { ProcedureLoadError, ProcedureMissing } from './ProcedurePage';
import { ProceduresNav } from './ProceduresNav';

export function CrewPage() {
  const id = idParam(useParams().id);
  if (id === null) return <ProcedureMissing />;
  return <CrewView id={id} />;
}

function CrewView({ id }: { id: number }) {
  const me = useSignedInMe();
  const canEdit = canEditStations(me.roles);
  const procedure = useProcedure(id);
  const plans = useCrewPlans();
  const stations = useStations();
  const people = useCrewPeople({ enabled: canEdit });
  const p = procedure.data;
  const revNumber = p ? (p.latestReleased?.number ?? p.revisions.at(-1)?.number ?? 1) : 1;
  const revision = useRevision(id, revNumber, { enabled: !!p });
  const [adding, setAdding] = useState(false);

  if (procedure.isPending) return <Loading label="Loading procedure…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  const mine = (plans.data ?? []).filter((plan) => plan.procedureId === id);
  const needed = revision.data?.neededStations ?? [];

  return (
    <Page
      title="Crew plans"
      kicker={p!.name}
      actions={
        canEdit && !adding ? (
          <Button variant="primary" onClick={() => setAdding(true)}>
            New crew plan
          </Button>
        ) : null
      }
    >
      <ProceduresNav />
      <p className="mb-4">
        <Link to={`/procedures/${id}`}>Back to the procedure</Link>
      </p>
      <p className="mb-5 max-w-prose">
        A crew plan puts people at stations. The manning check compares it with the stations revision {revNumber}
        {p!.latestReleased ? ' (the released one)' : ' (the draft)'} needs: {needed.length ? needed.join(', ') : 'loading…'}. A deactivated
        account does not man a station.
      </p>
      {adding && stations.data && people.data ? (
        <Section title="New crew plan" className="mb-6">
          <CrewPlanForm procedure={p!} stations={stations.data} people={people.data} needed={needed} onDone={() => setAdding(false)} />
        </Section>
      ) : adding ? (
        <Loading label="Loading stations and people…" />
      ) : null}
      {plans.isPending ? <Loading label="Loading crew plans…" /> : null}
      {plans.isError ? (
        <Notice tone="danger" title="Could not load the crew plans">
          <p>{errorMessage(plans.error)}</p>
        </Notice>
      ) : null}
      {plans.data && mine.length === 0 ? <p>No crew plan for this procedure yet.</p> : null}
      <div className="flex flex-col gap-6">
        {mine.map((plan) => (
          <PlanCard key={plan.id} plan={plan} procedure={p!} canEdit={canEdit} stations={stations.data ?? []} people={people.data} needed={needed} />
        ))}
      </div>
    </Page>
  );
}

function PlanCard({
  plan,
  procedure,
  canEdit,
  stations,
  people,
  needed,
}: {
  plan: CrewPlanDto;
  procedure: ProcedureDto;
  canEdit: boolean;
  stations: readonly StationDto[];
  people: readonly CrewPersonDto[] | undefined;
  needed: readonly string[];
}) {
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteCrewPlan();
  const byStation = new Map<string, CrewPlanDto['assignments']>();
  for (const a of plan.assignments) byStation.set(a.stationCode, [...(byStation.get(a.stationCode) ?? []), a]);
  const listed = [...new Set([...needed, ...plan.assignments.map((a) => a.stationCode)])];

  return (
    <Section title={plan.name}>
      {editing && people ? (
        <CrewPlanForm procedure={procedure} plan={plan} stations={stations} people={people} needed={needed} onDone={() => setEditing(false)} />
      ) : (
        <div className="flex flex-col gap-4">
          <p>
            {plan.testDate ? <>Test day: {format(parseISO(plan.testDate), 'd MMM yyyy')}. </> : 'No test day set. '}
            {plan.notes ? <span className="block max-w-prose">{plan.notes}</span> : null}
          </p>
          <ManningPanel planId={plan.id} procedureId={procedure.id} />
          <div role="region" aria-label={`Crew of ${plan.name}`} tabIndex={0} className="overflow-x-auto">
            <table className="w-full min-w-[20rem] border-collapse text-left">
              <caption className="sr-only">Who stands at each station</caption>
              <thead>
                <tr>
                  <th scope="col" className="border-2 border-line p-2">
                    Station
                  </th>
                  <th scope="col" className="border-2 border-line p-2">
                    People
                  </th>
                </tr>
              </thead>
              <tbody>
                {listed.map((code) => {
                  const s = stations.find((x) => x.code === code);
                  const crew = byStation.get(code) ?? [];
                  return (
                    <tr key={code} className="align-top">
                      <th scope="row" className="border-2 border-line p-2 font-normal">
                        <span className="font-bold">{code}</span> {s ? <span className="text-ink-muted">{s.name}</span> : null}
                        {needed.includes(code) ? null : <span className="block text-sm text-ink-muted">not needed by this procedure</span>}
                      </th>
                      <td className="border-2 border-line p-2">
                        {crew.length ? (
                          crew.map((a) => (
                            <span key={a.userId} className="block">
                              {a.userName}
                              {a.active ? '' : ' (deactivated)'}
                            </span>
                          ))
                        ) : (
                          <span className="font-bold text-danger">Nobody</span>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {canEdit ? (
            <div className="flex flex-wrap gap-2">
              <Button onClick={() => setEditing(true)} disabled={!people}>
                Edit plan
              </Button>
              {confirming ? (
                <>
                  <Button variant="danger" pending={remove.isPending} pendingLabel="Deleting…" onClick={() => remove.mutate(plan.id)}>
                    Delete “{plan.name}”
                  </Button>
                  <Button variant="quiet" onClick={() => setConfirming(false)}>
                    Keep it
                  </Button>
                </>
              ) : (
                <Button variant="quiet" onClick={() => setConfirming(true)}>
                  Delete plan
                </Button>
              )}
            </div>
          ) : null}
          {remove.isError ? (
            <Notice tone="danger" title="Not deleted">
              <p>{errorMessage(remove.error)}</p>
            </Notice>
          ) : null}
        </div>
      )}
    </Section>
  );
}

function ManningPanel({ planId, procedureId }: { planId: number; procedureId: number }) {
  const manning = useManning(planId, procedureId);
  if (manning.isPending) return <Loading label="Checking the manning…" />;
  if (manning.isError)
    return (
      <Notice tone="danger" title="Could not check the manning">
        <p>{errorMessage(manning.error)}</p>
      </Notice>
    );
  const m = manning.data;
  return (
    <div className="flex flex-col gap-3" aria-live="polite">
      {m.ok ? (
        <Notice tone="success" title="Every needed station is manned" announce={undefined}>
          <p>Checked against revision {m.revisionNumber}: {m.stations.length} stations, each with at least one active person.</p>
        </Notice>
      ) : (
        <Notice tone="danger" title={`${m.unmanned.length} needed station${m.unmanned.length === 1 ? '' : 's'} unmanned`} announce={undefined}>
          <p>
            Checked against revision {m.revisionNumber}. Nobody is at: <span className="font-bold">{m.unmanned.join(', ')}</span>. A count needs
            someone at every station its steps and polls name.
          </p>
        </Notice>
      )}
      <ul className="flex flex-wrap gap-2" aria-label="Manning by station">
        {m.stations.map((s) => (
          <li key={s.station}>
            {s.manned ? (
              <Badge tone="go" glyph="person">
                {s.station}: {s.people.map((x) => x.userName).join(', ')}
              </Badge>
            ) : (
              <Badge tone="danger" glyph="cross">
                {s.station}: unmanned
              </Badge>
            )}
          </li>
        ))}
      </ul>
      {m.inactive.length ? (
        <p className="flex items-start gap-1.5">
          <Glyph shape="triangle" className="mt-1" />
          Deactivated, so not counted: {m.inactive.map((x) => `${x.userName} at ${x.station}`).join('; ')}.
        </p>
      ) : null}
      {m.doubled.length ? (
        <p className="flex items-start gap-1.5">
          <Glyph shape="triangle" className="mt-1" />
          At more than one station (allowed, worth a look before the day): {m.doubled.map((x) => `${x.userName} (${x.stations.join(', ')})`).join('; ')}.
        </p>
      ) : null}
      {m.unknownStations.length ? (
        <p className="flex items-start gap-1.5">
          <Glyph shape="triangle" className="mt-1" />
          The procedure names stations your team does not have: {m.unknownStations.join(', ')}.
        </p>
      ) : null}
    </div>
  );
}

// ---------------------------------------------------------------- the form

const assignment = z.object({ stationId: z.number().int().positive(), userId: z.number().int().positive() });
const crewFormSchema = z.object({
  name: crewPlanInputSchema.shape.name,
  testDate: z.union([z.literal(''), z.iso.date('Use a date like 2025-05-17')]),
  notes: crewPlanInputSchema.shape.notes,
  assignments: z.array(assignment).max(200, 'List at most 200 assignments'),
});
type CrewFormValues = z.input<typeof crewFormSchema>;
const CREW_FIELDS = ['name', 'testDate', 'notes', 'assignments'] as const;

function CrewPlanForm({
  procedure,
  plan,
  stations,
  people,
  needed,
  onDone,
}: {
  procedure: ProcedureDto;
  plan?: CrewPlanDto;
  stations: readonly StationDto[];
  people: readonly CrewPersonDto[];
  needed: readonly string[];
  onDone: () => void;
}) {
  const save = useSaveCrewPlan();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<CrewFormValues>({
    resolver: zodResolver(crewFormSchema),
    defaultValues: {
      name: plan?.name ?? `${procedure.name} crew`,
      testDate: plan?.testDate ?? '',
      notes: plan?.notes ?? '',
      assignments: plan?.assignments.map((a) => ({ stationId: a.stationId, userId: a.userId })) ?? [],
    },
  });
  const { register, control, handleSubmit, setError, formState } = form;
  const e = formState.errors;
  const submit = handleSubmit(async (v) => {
    setFormError(null);
    try {
      await save.mutateAsync({
        id: plan?.id,
        input: { name: v.name, procedureId: procedure.id, testDate: v.testDate === '' ? null : v.testDate, notes: v.notes ?? '', assignments: v.assignments },
      });
      onDone();
    } catch (error) {
      setFormError(applyServerError(error, setError, CREW_FIELDS));
    }
  });
  return (
    <Form onSubmit={(event) => void submit(event)} aria-label={plan ? `Edit ${plan.name}` : 'New crew plan'}>
      <FormError title="Not saved" message={formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Plan name" error={e.name?.message} {...register('name')} />
        <TextField label="Test day" type="date" hint="Optional." error={e.testDate?.message} {...register('testDate')} />
      </div>
      <TextAreaField label="Notes" hint="Muster point, keys, first aid: anything the crew should know." rows={3} error={e.notes?.message} {...register('notes')} />
      <Controller
        control={control}
        name="assignments"
        render={({ field, fieldState }) => (
          <AssignmentEditor
            stations={stations}
            people={people}
            needed={needed}
            value={field.value}
            onChange={field.onChange}
            error={fieldState.error?.message ?? (Array.isArray(fieldState.error) ? 'One of the assignments is not valid.' : undefined)}
          />
        )}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={formState.isSubmitting} pendingLabel="Saving…">
          {plan ? 'Save crew plan' : 'Create crew plan'}
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

function AssignmentEditor({
  stations,
  people,
  needed,
  value,
  onChange,
  error,
}: {
  stations: readonly StationDto[];
  people: readonly CrewPersonDto[];
  needed: readonly string[];
  value: readonly { stationId: number; userId: number }[];
  onChange: (next: { stationId: number; userId: number }[]) => void;
  error?: string;
}) {
  const id = useId();
  // Needed stations first, in the order the procedure meets them.
  const ordered = [...stations].sort((a, b) => {
    const ia = needed.indexOf(a.code);
    const ib = needed.indexOf(b.code);
    return (ia < 0 ? 999 : ia) - (ib < 0 ? 999 : ib);
  });
  const name = (uid: number) => people.find((p) => p.id === uid)?.name ?? `person ${uid}`;
  return (
    <fieldset aria-describedby={error ? `${id}-error` : undefined} className="min-w-0">
      <legend className="mb-2 font-bold">Who stands at each station</legend>
      <ul className="flex flex-col gap-3">
        {ordered.map((s) => {
          const here = value.filter((a) => a.stationId === s.id);
          const free = people.filter((p) => !here.some((a) => a.userId === p.id));
          const isNeeded = needed.includes(s.code);
          return (
            <li key={s.id} className={`rounded-md border-2 p-2 ${isNeeded && here.length === 0 ? 'border-danger' : 'border-line-soft'}`}>
              <p className="flex flex-wrap items-center gap-2">
                <span className="font-bold">{s.code}</span>
                <span>{s.name}</span>
                {isNeeded ? (
                  here.length ? (
                    <span className="text-sm text-ink-muted">needed</span>
                  ) : (
                    <span className="inline-flex items-center gap-1 text-sm font-bold text-danger">
                      <Glyph shape="cross" /> needed, nobody yet
                    </span>
                  )
                ) : (
                  <span className="text-sm text-ink-muted">not needed by this procedure</span>
                )}
              </p>
              {here.length ? (
                <ul className="mt-1 flex flex-wrap gap-2" aria-label={`People at ${s.code}`}>
                  {here.map((a) => (
                    <li key={a.userId}>
                      <button
                        type="button"
                        onClick={() => onChange(value.filter((x) => !(x.stationId === s.id && x.userId === a.userId)))}
                        aria-label={`Take ${name(a.userId)} off ${s.code}`}
                        className="inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-md border-2 border-line bg-selected px-3 font-bold text-ink hover:bg-surface"
                      >
                        {name(a.userId)}
                        <Glyph shape="cross" />
                      </button>
                    </li>
                  ))}
                </ul>
              ) : null}
              {free.length ? (
                <div className="mt-2 flex flex-col gap-1">
                  <label htmlFor={`${id}-${s.id}`} className="text-sm font-bold">
                    Add someone at {s.code}
                  </label>
                  <select
                    id={`${id}-${s.id}`}
                    value=""
                    onChange={(e) => {
                      const uid = Number(e.target.value);
                      if (uid) onChange([...value, { stationId: s.id, userId: uid }]);
                    }}
                    className="min-h-12 w-full max-w-sm rounded-md border-2 border-line bg-surface px-2 text-ink"
                  >
                    <option value="">Choose a person…</option>
                    {free.map((p) => (
                      <option key={p.id} value={p.id}>
                        {p.name}
                      </option>
                    ))}
                  </select>
                </div>
              ) : null}
            </li>
          );
        })}
      </ul>
      <FieldError id={`${id}-error`} message={error} />
    </fieldset>
  );
}
