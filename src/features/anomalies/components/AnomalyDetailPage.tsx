import { useId, useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Badge } from '../../../components/ui/Badge';
import { Button, buttonClasses } from '../../../components/ui/Button';
import { FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';
import { Time } from '../../../components/ui/Time';
import { UploadedFile } from '../../../components/ui/UploadedFile';
import { ACTION_STATUSES, type ActionStatus, type AnomalyDto } from '../../../contract/anomalies';
import { formatBytes, UPLOAD_MAX_BYTES, UPLOAD_MAX_IN_WORDS, UPLOAD_TYPES, UPLOAD_TYPES_IN_WORDS } from '../../../contract/uploads';
import { errorMessage, isApiError } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useAddCorrectiveAction } from '../api/addCorrectiveAction';
import { useCloseAnomaly } from '../api/closeAnomaly';
import { useAnomaly } from '../api/getAnomaly';
import { useLinkHazard } from '../api/linkHazard';
import { useAnomalyPeople } from '../api/listAnomalyPeople';
import { useHazardChoices } from '../api/listHazardChoices';
import { useProcedureChoices } from '../api/listProcedureChoices';
import { useOpenLesson } from '../api/openLesson';
import { useRemoveAnomalyFile } from '../api/removeAnomalyFile';
import { useReopenAnomaly } from '../api/reopenAnomaly';
import { useSeverityScale } from '../api/listSeverities';
import { useUnlinkHazard } from '../api/unlinkHazard';
import { useUpdateAnomaly } from '../api/updateAnomaly';
import { useUpdateCorrectiveAction } from '../api/updateCorrectiveAction';
import { useUploadAnomalyFile } from '../api/uploadAnomalyFile';
import { ACTION_LOOK, canAddHazards, canClose, canDraftProcedures, canReport, STATUS_LOOK, wallTime } from '../lib/format';

const ACCEPT = [...UPLOAD_TYPES.map((t) => t.mediaType), ...UPLOAD_TYPES.flatMap((t) => t.extensions.map((e) => `.${e}`))].join(',');

type Say = (tone: 'success' | 'danger', text: string) => void;

export function AnomalyDetailPage() {
  const { id } = useParams();
  const anomalyId = Number(id);
  const anomaly = useAnomaly(anomalyId);
  if (anomaly.isPending) return <Loading label="Loading the anomaly…" />;
  if (anomaly.isError)
    return (
      <Page title="Anomaly" kicker="Anomalies">
        <Notice tone="danger" title="Could not load this anomaly">
          <p>{errorMessage(anomaly.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/anomalies">Back to the anomalies</Link>
        </p>
      </Page>
    );
  return <AnomalyDetail a={anomaly.data} />;
}

export function AnomalyDetail({ a }: { a: AnomalyDto }) {
  const me = useSignedInMe();
  const [notice, setNotice] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const say: Say = (tone, text) => setNotice({ tone, text });
  const look = STATUS_LOOK[a.status];
  const writable = canReport(me.roles) && a.status === 'open';

  return (
    <Page
      title={a.title}
      kicker={`Anomaly ${a.ref}`}
      actions={
        <Link to="/anomalies" className="font-bold">
          All anomalies
        </Link>
      }
    >
      <div className="flex flex-col gap-4">
        <p className="flex flex-wrap items-center gap-2">
          <Badge tone={look.tone} glyph={look.glyph}>
            {look.word}
          </Badge>
          <span className="font-bold">Severity {a.severityLabel}</span>
          {a.reportedBy ? <span className="text-ink-muted">Reported by {a.reportedBy}</span> : null}
        </p>
        <div aria-live="polite">
          {notice ? (
            <Notice tone={notice.tone} title={notice.tone === 'success' ? 'Done' : 'Not done'}>
              <p>{notice.text}</p>
            </Notice>
          ) : null}
        </div>

        <Section title="When and where">
          <dl className="grid gap-x-4 gap-y-2 sm:grid-cols-[max-content_minmax(0,1fr)]">
            <dt className="font-bold">Wall time</dt>
            <dd>
              <time dateTime={a.at}>{wallTime(a.atMs)}</time> <span className="text-ink-muted">(your local time)</span>
            </dd>
            <dt className="font-bold">Count</dt>
            <dd className="[overflow-wrap:anywhere]">
              {a.countId === null ? (
                'None: found outside a count'
              ) : (
                <Link to={`/counts/${a.countId}/report`}>{a.countName ?? `Count ${a.countId}`}</Link>
              )}
            </dd>
            {a.countId !== null ? (
              <>
                <dt className="font-bold">Count time</dt>
                <dd>
                  {a.tText ? <strong className="font-mono text-lg">{a.tText}</strong> : 'Before the count started'}
                  {a.countStatus ? <span> ({a.countStatus})</span> : null}
                  {' · '}
                  <Link to={`/counts/${a.countId}/replay?at=${a.atMs}`}>Replay the count at this instant</Link>
                </dd>
              </>
            ) : null}
          </dl>
        </Section>

        <Section title="What happened">
          <ReportFacts a={a} writable={writable} say={say} />
        </Section>

        <HazardsSection a={a} writable={writable} say={say} />
        <ActionsSection a={a} writable={writable} say={say} />
        <FilesSection a={a} writable={writable} say={say} />
        <LessonsSection a={a} say={say} />
        <CloseSection a={a} say={say} />

        <Section title="History">
          <ol className="flex flex-col gap-2" aria-label="Changes, oldest first">
            {a.history.map((h) => (
              <li key={h.id} className="border-l-4 border-line-soft pl-3">
                <p className="text-sm text-ink-muted">
                  <Time value={h.at} seconds /> · {h.userName}
                </p>
                <p className="[overflow-wrap:anywhere]">{h.text}</p>
              </li>
            ))}
          </ol>
        </Section>
      </div>
    </Page>
  );
}

function HazardsSection({ a, writable, say }: { a: AnomalyDto; writable: boolean; say: Say }) {
  const me = useSignedInMe();
  const hazards = useHazardChoices();
  const link = useLinkHazard();
  const unlink = useUnlinkHazard();
  const [chosen, setChosen] = useState('');
  const [error, setError] = useState<string | undefined>();
  const options = (hazards.data ?? []).filter((h) => !a.hazardIds.includes(h.id)).map((h) => ({ value: String(h.id), label: `${h.code} ${h.title}` }));

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setError(undefined);
    if (!chosen) return setError('Choose a hazard to link.');
    try {
      const saved = await link.mutateAsync({ id: a.id, hazardId: Number(chosen) });
      const h = saved.hazards.find((x) => x.id === Number(chosen));
      setChosen('');
      say('success', `Linked ${h ? `${h.code} ${h.title}` : 'the hazard'}.`);
    } catch (err) {
      setError(errorMessage(err));
    }
  };

  return (
    <Section title="Hazards">
      {a.hazards.length === 0 ? <p>No hazard linked yet.</p> : null}
      <ul className="flex flex-col gap-2" aria-label="Linked hazards">
        {a.hazards.map((h) => (
          <li key={h.id} className="flex flex-wrap items-center gap-2">
            <Link to={`/hazards/${h.id}`} className="font-bold [overflow-wrap:anywhere]">
              {h.code} {h.title}
            </Link>
            {writable ? (
              <Button
                variant="quiet"
                onClick={() =>
                  unlink.mutateAsync({ id: a.id, hazardId: h.id }).then(
                    () => say('success', `Unlinked ${h.code}.`),
                    (err: unknown) => say('danger', errorMessage(err)),
                  )
                }
              >
                Unlink <span className="sr-only">{h.code}</span>
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
      {writable ? (
        <Form onSubmit={(e) => void submit(e)} aria-label="Link a hazard" className="mt-3">
          <SelectField label="Hazard to link" placeholder="Choose…" options={options} value={chosen} error={error} onChange={(e) => setChosen(e.target.value)} />
          <FormActions>
            <Button type="submit" pending={link.isPending} pendingLabel="Linking…">
              Link hazard
            </Button>
            {canAddHazards(me.roles) ? (
              <Link to={`/hazards/new?anomaly=${a.id}`} className={buttonClasses('secondary')}>
                New hazard from this anomaly
              </Link>
            ) : null}
          </FormActions>
        </Form>
      ) : null}
    </Section>
  );
}

function ActionsSection({ a, writable, say }: { a: AnomalyDto; writable: boolean; say: Say }) {
  const people = useAnomalyPeople();
  const add = useAddCorrectiveAction();
  const update = useUpdateCorrectiveAction();
  const [description, setDescription] = useState('');
  const [ownerId, setOwnerId] = useState('');
  const [dueDate, setDueDate] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const ownerOptions = (people.data ?? []).map((p) => ({ value: String(p.id), label: p.name }));

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const problems: Record<string, string> = {};
    if (!description.trim()) problems.description = 'Say what is to be done.';
    if (!ownerId) problems.ownerId = 'Choose who owns it.';
    if (!/^\d{4}-\d{2}-\d{2}$/.test(dueDate)) problems.dueDate = 'Give the due date.';
    setErrors(problems);
    if (Object.keys(problems).length) return;
    try {
      await add.mutateAsync({ id: a.id, description: description.trim(), ownerId: Number(ownerId), dueDate });
      const owner = ownerOptions.find((o) => o.value === ownerId)?.label ?? 'the owner';
      setDescription('');
      setOwnerId('');
      setDueDate('');
      say('success', `Added the corrective action; ${owner} is told by e-mail.`);
    } catch (err) {
      const next: Record<string, string> = {};
      if (isApiError(err)) for (const d of err.details) next[d.path] = d.message;
      setErrors(Object.keys(next).length ? next : { form: errorMessage(err) });
    }
  };

  const setStatus = (actionId: number, status: ActionStatus) =>
    update.mutateAsync({ id: a.id, actionId, status }).then(
      () => say('success', `Marked ${ACTION_LOOK[status].word.toLowerCase()}.`),
      (err: unknown) => say('danger', errorMessage(err)),
    );

  return (
    <Section title="Corrective actions">
      {a.actions.length === 0 ? <p>No corrective action yet.</p> : null}
      <ul className="flex flex-col gap-3" aria-label="Corrective actions">
        {a.actions.map((c) => (
          <li key={c.id} className="flex min-w-0 flex-col gap-2 rounded-md border-2 border-line-soft p-3">
            <p className="font-bold [overflow-wrap:anywhere]">{c.description}</p>
            <p className="flex flex-wrap items-center gap-2 text-sm">
              <Badge tone={ACTION_LOOK[c.status].tone} glyph={ACTION_LOOK[c.status].glyph}>
                {ACTION_LOOK[c.status].word}
              </Badge>
              <span>Owner: {c.ownerName ?? 'nobody'}</span>
              <span>Due: {c.dueDate}</span>
            </p>
            {writable ? (
              <SelectField
                label={`Status of “${c.description.length > 40 ? `${c.description.slice(0, 39)}…` : c.description}”`}
                options={ACTION_STATUSES.map((s) => ({ value: s, label: ACTION_LOOK[s].word }))}
                value={c.status}
                onChange={(e) => void setStatus(c.id, e.target.value as ActionStatus)}
              />
            ) : null}
          </li>
        ))}
      </ul>
      {writable ? (
        <Form onSubmit={(e) => void submit(e)} aria-label="Add a corrective action" className="mt-4 rounded-md border-2 border-line-soft p-3">
          <h3 className="text-lg font-bold">Add a corrective action</h3>
          {errors.form ? (
            <Notice tone="danger" title="Not added">
              <p>{errors.form}</p>
            </Notice>
          ) : null}
          <TextAreaField label="What is to be done" rows={2} value={description} error={errors.description} onChange={(e) => setDescription(e.target.value)} />
          <div className="grid gap-4 sm:grid-cols-2">
            <SelectField label="Owner" hint="They get an e-mail saying it is theirs." placeholder="Choose…" options={ownerOptions} value={ownerId} error={errors.ownerId} onChange={(e) => setOwnerId(e.target.value)} />
            <TextField label="Due date" type="date" value={dueDate} error={errors.dueDate} onChange={(e) => setDueDate(e.target.value)} />
          </div>
          <FormActions>
            <Button type="submit" variant="primary" pending={add.isPending} pendingLabel="Adding…">
              Add corrective action
            </Button>
          </FormActions>
        </Form>
      ) : null}
    </Section>
  );
}

function FilesSection({ a, writable, say }: { a: AnomalyDto; writable: boolean; say: Say }) {
  const upload = useUploadAnomalyFile();
  const remove = useRemoveAnomalyFile();
  const [file, setFile] = useState<File | null>(null);
  const [caption, setCaption] = useState('');
  const [fileError, setFileError] = useState<string | undefined>();
  const [inputKey, setInputKey] = useState(0);
  const id = useId();

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setFileError(undefined);
    if (!file) return setFileError('Choose a file to upload.');
    if (file.size === 0) return setFileError('That file is empty.');
    if (file.size > UPLOAD_MAX_BYTES) return setFileError(`That file is ${formatBytes(file.size)}, more than the ${UPLOAD_MAX_IN_WORDS} limit.`);
    try {
      await upload.mutateAsync({ id: a.id, file, caption });
      say('success', `Attached “${caption.trim() || file.name}”.`);
      setFile(null);
      setCaption('');
      setInputKey((k) => k + 1);
    } catch (err) {
      setFileError(errorMessage(err));
    }
  };

  return (
    <Section title="Photos and files">
      {a.attachments.length === 0 ? <p>No photo or file yet.</p> : null}
      <ul className="flex flex-col gap-3" aria-label="Photos and files">
        {a.attachments.map((x) => (
          <li key={x.id} className="min-w-0">
            <UploadedFile file={x.file} title={x.caption || x.file.name} imageWord="Photo">
              {x.addedBy ? <p className="text-sm text-ink-muted">Added by {x.addedBy}</p> : null}
              {writable ? (
                <Button
                  variant="quiet"
                  onClick={() =>
                    remove.mutateAsync({ id: a.id, attachmentId: x.id }).then(
                      () => say('success', `Removed “${x.caption || x.file.name}”.`),
                      (err: unknown) => say('danger', errorMessage(err)),
                    )
                  }
                >
                  Remove <span className="sr-only">{x.file.name}</span>
                </Button>
              ) : null}
            </UploadedFile>
          </li>
        ))}
      </ul>
      {writable ? (
        <Form onSubmit={(e) => void submit(e)} aria-label="Attach a photo or file" className="mt-4 rounded-md border-2 border-line-soft p-3">
          <div className="flex min-w-0 flex-col gap-1">
            <label htmlFor={id} className="font-bold">
              Photo or file
            </label>
            <p id={`${id}-hint`} className="text-sm text-ink-muted">
              {UPLOAD_TYPES_IN_WORDS}; up to {UPLOAD_MAX_IN_WORDS}. Holdfire checks the type from the file's content, not its name.
            </p>
            <input
              key={inputKey}
              id={id}
              type="file"
              accept={ACCEPT}
              aria-invalid={fileError ? true : undefined}
              aria-describedby={[`${id}-hint`, fileError ? `${id}-error` : null].filter(Boolean).join(' ')}
              className={`min-h-12 w-full min-w-0 rounded-md bg-surface p-2 text-ink file:mr-3 file:min-h-10 file:rounded-md file:border-2 file:border-line file:bg-surface file:px-3 file:font-bold file:text-ink ${fileError ? 'border-[3px] border-danger' : 'border-2 border-line'}`}
              onChange={(e) => {
                setFileError(undefined);
                setFile(e.target.files?.[0] ?? null);
              }}
            />
            <FieldError id={`${id}-error`} message={fileError} />
          </div>
          <TextField label="Caption (optional)" maxLength={200} autoComplete="off" value={caption} onChange={(e) => setCaption(e.target.value)} />
          <FormActions>
            <Button type="submit" pending={upload.isPending} pendingLabel="Uploading…">
              Attach
            </Button>
          </FormActions>
        </Form>
      ) : null}
    </Section>
  );
}

function LessonsSection({ a, say }: { a: AnomalyDto; say: Say }) {
  const me = useSignedInMe();
  const procedures = useProcedureChoices();
  const open = useOpenLesson();
  const [chosen, setChosen] = useState('');
  const [error, setError] = useState<string | undefined>();
  const may = canDraftProcedures(me.roles);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setError(undefined);
    if (!chosen) return setError('Choose the procedure to change.');
    try {
      const lesson = await open.mutateAsync({ id: a.id, procedureId: Number(chosen) });
      setChosen('');
      say(
        'success',
        lesson.created
          ? `Opened revision ${lesson.revisionNumber} as a draft, linked to this anomaly.`
          : `Revision ${lesson.revisionNumber} was already a draft: it is now linked to this anomaly, and no second draft was made.`,
      );
    } catch (err) {
      setError(errorMessage(err));
    }
  };

  return (
    <Section title="Lessons learned">
      {a.revisions.length === 0 ? <p>No procedure revision opened because of this anomaly yet.</p> : null}
      <ul className="flex flex-col gap-2" aria-label="Procedure revisions opened from this anomaly">
        {a.revisions.map((r) => (
          <li key={`${r.procedureId}-${r.revisionNumber}`} className="[overflow-wrap:anywhere]">
            <Link to={`/procedures/${r.procedureId}/revisions/${r.revisionNumber}`} className="font-bold">
              {r.procedureName}, revision {r.revisionNumber}
            </Link>{' '}
            <span className="text-ink-muted">
              ({r.drafted ? 'drafted because of this anomaly' : 'a draft already open, linked'}; now {r.revisionStatus})
            </span>
          </li>
        ))}
      </ul>
      {may ? (
        <Form onSubmit={(e) => void submit(e)} aria-label="Change a procedure" className="mt-3">
          <SelectField
            label="Procedure to change"
            hint="Opens a draft revision of it, linked to this anomaly. If a draft is already open, that draft is linked instead."
            placeholder="Choose…"
            options={(procedures.data ?? []).map((p) => ({ value: String(p.id), label: p.draft ? `${p.name} (revision ${p.draft.number} is a draft)` : p.name }))}
            value={chosen}
            error={error}
            onChange={(e) => setChosen(e.target.value)}
          />
          <FormActions>
            <Button type="submit" pending={open.isPending} pendingLabel="Opening…">
              Open a draft revision
            </Button>
          </FormActions>
        </Form>
      ) : null}
    </Section>
  );
}

function CloseSection({ a, say }: { a: AnomalyDto; say: Say }) {
  const me = useSignedInMe();
  const close = useCloseAnomaly();
  const reopen = useReopenAnomaly();
  const [note, setNote] = useState('');
  const safety = canClose(me.roles);
  const notDone = a.actions.filter((c) => c.status !== 'done').length;

  const act = async (e: FormEvent) => {
    e.preventDefault();
    try {
      if (a.status === 'open') {
        await close.mutateAsync({ id: a.id, note });
        say('success', `${a.ref} is closed.`);
      } else {
        await reopen.mutateAsync({ id: a.id, note });
        say('success', `${a.ref} is open again.`);
      }
      setNote('');
    } catch (err) {
      say('danger', errorMessage(err));
    }
  };

  return (
    <Section title={a.status === 'open' ? 'Close' : 'Closed'}>
      <Notice tone="warning" title="A record, not a safety authority">
        <p>
          Holdfire is a planning and record aid, not a safety authority. Closing here records the safety officer's decision; it does not make the stand
          or the engine safe, and it does not replace the team's own review.
        </p>
      </Notice>
      {a.status === 'closed' ? (
        <p className="mt-3">
          Closed {a.closedAt ? <Time value={a.closedAt} /> : null}
          {a.closedBy ? ` by ${a.closedBy}` : ''}.
        </p>
      ) : notDone > 0 ? (
        <p className="mt-3">
          {notDone === 1 ? 'One corrective action is' : `${notDone} corrective actions are`} not done: the anomaly cannot be closed until every one is.
        </p>
      ) : null}
      {safety ? (
        <Form onSubmit={(e) => void act(e)} aria-label={a.status === 'open' ? 'Close the anomaly' : 'Reopen the anomaly'} className="mt-3">
          <TextField label={a.status === 'open' ? 'Closing note (optional)' : 'Why it is reopened (optional)'} value={note} maxLength={1000} onChange={(e) => setNote(e.target.value)} />
          <FormActions>
            <Button type="submit" variant={a.status === 'open' ? 'primary' : 'secondary'} pending={close.isPending || reopen.isPending}>
              {a.status === 'open' ? 'Close anomaly' : 'Reopen anomaly'}
            </Button>
          </FormActions>
        </Form>
      ) : (
        <p className="mt-3 text-ink-muted">Only a safety officer closes or reopens an anomaly.</p>
      )}
    </Section>
  );
}

/** The report's words, and a form to correct them while the anomaly is open (the count and instant stay). */
function ReportFacts({ a, writable, say }: { a: AnomalyDto; writable: boolean; say: Say }) {
  const update = useUpdateAnomaly();
  const scale = useSeverityScale();
  const [editing, setEditing] = useState(false);
  const [title, setTitle] = useState(a.title);
  const [description, setDescription] = useState(a.description);
  const [immediateActions, setImmediateActions] = useState(a.immediateActions);
  const [severity, setSeverity] = useState(String(a.severity));
  const [errors, setErrors] = useState<Record<string, string>>({});
  // The severities offered are those of the matrix the report was rated on, when it is still the team's default.
  const severities = scale.data && scale.data.matrixId === a.matrixId ? scale.data.severities : null;

  const start = () => {
    setTitle(a.title);
    setDescription(a.description);
    setImmediateActions(a.immediateActions);
    setSeverity(String(a.severity));
    setErrors({});
    setEditing(true);
  };
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const problems: Record<string, string> = {};
    if (!title.trim()) problems.title = 'Enter a title';
    if (!description.trim()) problems.description = 'Say what happened';
    setErrors(problems);
    if (Object.keys(problems).length) return;
    try {
      await update.mutateAsync({
        id: a.id,
        title: title.trim(),
        description: description.trim(),
        immediateActions: immediateActions.trim(),
        ...(severities ? { severity: /^\d+$/.test(severity) ? Number(severity) : severity } : {}),
      });
      setEditing(false);
      say('success', 'Saved the corrections; the history says what changed.');
    } catch (err) {
      const next: Record<string, string> = {};
      if (isApiError(err)) for (const d of err.details) next[d.path] = d.message;
      setErrors(Object.keys(next).length ? next : { form: errorMessage(err) });
    }
  };

  if (!editing)
    return (
      <>
        <p className="whitespace-pre-wrap [overflow-wrap:anywhere]">{a.description}</p>
        <h3 className="mt-4 text-lg font-bold">Immediate actions taken</h3>
        <p className="whitespace-pre-wrap [overflow-wrap:anywhere]">{a.immediateActions || 'None recorded.'}</p>
        {writable ? (
          <Button className="mt-3" onClick={start}>
            Correct the report
          </Button>
        ) : null}
      </>
    );
  return (
    <Form onSubmit={(e) => void submit(e)} aria-label="Correct the report">
      {errors.form ? (
        <Notice tone="danger" title="Not saved">
          <p>{errors.form}</p>
        </Notice>
      ) : null}
      <TextField label="Title" value={title} maxLength={200} error={errors.title} onChange={(e) => setTitle(e.target.value)} />
      <TextAreaField label="What happened" value={description} error={errors.description} onChange={(e) => setDescription(e.target.value)} />
      {severities ? (
        <SelectField label="Severity" options={severities.map((s) => ({ value: s.key, label: `${s.key} ${s.label}` }))} value={severity} error={errors.severity} onChange={(e) => setSeverity(e.target.value)} />
      ) : null}
      <TextAreaField label="Immediate actions taken" value={immediateActions} error={errors.immediateActions} onChange={(e) => setImmediateActions(e.target.value)} />
      <FormActions>
        <Button type="submit" variant="primary" pending={update.isPending} pendingLabel="Saving…">
          Save corrections
        </Button>
        <Button variant="quiet" onClick={() => setEditing(false)}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}
