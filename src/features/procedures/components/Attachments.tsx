import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/ui/Button';
import { FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { SelectField } from '../../../components/ui/SelectField';
import { Time } from '../../../components/ui/Time';
import { UploadedFile } from '../../../components/ui/UploadedFile';
import { ATTACHMENT_CAPTION_MAX, type AttachmentDto, type RevisionDto } from '../../../contract/procedures';
import { formatBytes, UPLOAD_MAX_BYTES, UPLOAD_MAX_IN_WORDS, UPLOAD_TYPES, UPLOAD_TYPES_IN_WORDS } from '../../../contract/uploads';
import { errorMessage, isApiError } from '../../../lib/api';
import { useRemoveAttachment } from '../api/removeAttachment';
import { useUploadAttachment } from '../api/uploadAttachment';
import { tLabel } from '../lib/format';
import { firstNumbers } from './StepView';

// Media types let a phone offer its camera; extensions help desktop pickers. The server checks the bytes.
const ACCEPT = [...UPLOAD_TYPES.map((t) => t.mediaType), ...UPLOAD_TYPES.flatMap((t) => t.extensions.map((e) => `.${e}`))].join(',');
const LIMITS_IN_WORDS = `${UPLOAD_TYPES_IN_WORDS}; up to ${UPLOAD_MAX_IN_WORDS}. Holdfire checks the type from the file's content, not its name.`;
const WHOLE = '';

/** The files shown with the whole procedure: those for no step, and those whose step has since been deleted. */
export function procedureLevel(r: RevisionDto): AttachmentDto[] {
  return r.attachments.filter((a) => a.stepKey === null || a.stepRemoved);
}

export function attachmentsOfStep(r: RevisionDto, stepKey: string): AttachmentDto[] {
  return r.attachments.filter((a) => a.stepKey === stepKey);
}

export const attachmentTitle = (a: AttachmentDto) => a.caption || a.file.name;

/** "Step 5 · T-00:45:00 · Fill the LOX run tank…" for choosing where a file goes. */
function stepOptions(r: RevisionDto): { value: string; label: string }[] {
  const starts = firstNumbers(r.phases);
  return r.phases.flatMap((ph, p) =>
    ph.steps.map((st, i) => {
      const text = st.instruction.length > 60 ? `${st.instruction.slice(0, 59)}…` : st.instruction;
      return { value: st.key, label: `Step ${starts[p]! + i} · ${tLabel(st.tSeconds)} · ${text}` };
    }),
  );
}

interface UploadValues {
  file: FileList | undefined;
  caption: string;
  stepKey: string;
}

/** Upload one file to a draft, for the whole procedure or one step. */
export function AttachmentUploadForm({
  revision: r,
  onDone,
  onCancel,
}: {
  revision: RevisionDto;
  onDone: (message: string) => void;
  onCancel: () => void;
}) {
  const upload = useUploadAttachment();
  const form = useForm<UploadValues>({ defaultValues: { file: undefined, caption: '', stepKey: WHOLE } });
  const [fileError, setFileError] = useState<string | undefined>();
  const [formError, setFormError] = useState<string | null>(null);
  const id = useId();
  const e = form.formState.errors;

  const submit = form.handleSubmit(async (values) => {
    setFileError(undefined);
    setFormError(null);
    const file = values.file?.[0];
    if (!file) return setFileError('Choose a file to upload.');
    if (file.size === 0) return setFileError('That file is empty.');
    if (file.size > UPLOAD_MAX_BYTES) return setFileError(`That file is ${formatBytes(file.size)}, more than the ${UPLOAD_MAX_IN_WORDS} limit.`);
    try {
      const saved = await upload.mutateAsync({ procedureId: r.procedureId, rev: r.number, file, caption: values.caption, stepKey: values.stepKey || null });
      const name = values.caption.trim() || file.name;
      onDone(saved.signoffsCleared ? `Added “${name}”. The draft had been signed; those sign-offs were withdrawn and it needs signing again.` : `Added “${name}”.`);
    } catch (error) {
      const details = isApiError(error) ? error.details : [];
      const caption = details.find((d) => d.path === 'caption');
      const step = details.find((d) => d.path === 'stepKey');
      if (caption) form.setError('caption', { message: caption.message });
      else if (step) form.setError('stepKey', { message: `${step.message} Reload the page; the steps may have changed.` });
      else if (isApiError(error) && (details.some((d) => d.path === 'file') || error.status === 413 || error.status === 415)) setFileError(error.message);
      else setFormError(errorMessage(error));
    }
  });

  const describedBy = [`${id}-hint`, fileError ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <Form onSubmit={(ev) => void submit(ev)} aria-label="Attach a diagram or photo" className="hf-no-print rounded-md border-2 border-line-soft p-3">
      <FormError title="File not attached" message={formError} />
      <div className="flex min-w-0 flex-col gap-1">
        <label htmlFor={id} className="font-bold">
          File
        </label>
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {LIMITS_IN_WORDS}
        </p>
        <input
          id={id}
          type="file"
          accept={ACCEPT}
          aria-invalid={fileError ? true : undefined}
          aria-describedby={describedBy}
          className={`min-h-12 w-full min-w-0 rounded-md bg-surface p-2 text-ink file:mr-3 file:min-h-10 file:rounded-md file:border-2 file:border-line file:bg-surface file:px-3 file:font-bold file:text-ink ${fileError ? 'border-[3px] border-danger' : 'border-2 border-line'}`}
          {...form.register('file', { onChange: () => setFileError(undefined) })}
        />
        <FieldError id={`${id}-error`} message={fileError} />
      </div>
      <TextField
        label="Caption (optional)"
        hint="What it shows, e.g. “LOX fill valve, handle closed”. Without a caption the file name is used."
        maxLength={ATTACHMENT_CAPTION_MAX}
        autoComplete="off"
        error={e.caption?.message}
        {...form.register('caption', { maxLength: { value: ATTACHMENT_CAPTION_MAX, message: `Use at most ${ATTACHMENT_CAPTION_MAX} characters` } })}
      />
      <SelectField
        label="Attach to"
        hint="The whole procedure, or one step (shown beside it here and on the printed copy)."
        options={[{ value: WHOLE, label: 'The whole procedure' }, ...stepOptions(r)]}
        error={e.stepKey?.message}
        {...form.register('stepKey')}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={upload.isPending} pendingLabel="Uploading…">
          Attach file
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

/** A list of attachments; a writer on a draft may remove each (after confirming). */
export function AttachmentList({ revision: r, attachments, canEdit, label }: { revision: RevisionDto; attachments: AttachmentDto[]; canEdit: boolean; label: string }) {
  const remove = useRemoveAttachment();
  const [message, setMessage] = useState<string | null>(null);
  const [removeError, setRemoveError] = useState<string | null>(null);
  const editable = canEdit && r.status === 'draft';
  return (
    <>
      {removeError ? (
        <Notice tone="danger" title="File not removed">
          <p>{removeError}</p>
        </Notice>
      ) : null}
      {attachments.length ? (
        <ul aria-label={label} className="flex min-w-0 flex-col gap-3">
          {attachments.map((a) => (
            <li key={a.id} className="flex min-w-0 flex-col gap-2 rounded-md border-2 border-line-soft bg-sunken p-3">
              <UploadedFile file={a.file} title={attachmentTitle(a)}>
                {a.stepRemoved ? <p className="text-sm font-bold">Attached to a step that is no longer in this revision.</p> : null}
                <p className="text-sm text-ink-muted">
                  Added <Time value={a.createdAt} />
                  {a.addedBy ? <> by {a.addedBy}</> : null}
                </p>
              </UploadedFile>
              {editable ? (
                <div className="hf-no-print">
                  <Button
                    variant="danger"
                    aria-label={`Remove ${attachmentTitle(a).slice(0, 80)}`}
                    pending={remove.isPending && remove.variables?.attachmentId === a.id}
                    pendingLabel="Removing…"
                    onClick={() => {
                      const title = attachmentTitle(a);
                      if (!window.confirm(`Remove “${title}” from revision ${r.number}? Earlier revisions keep it.`)) return;
                      setRemoveError(null);
                      setMessage(null);
                      remove.mutate(
                        { procedureId: r.procedureId, rev: r.number, attachmentId: a.id },
                        {
                          onSuccess: (saved) =>
                            setMessage(saved.signoffsCleared ? `Removed “${title}”. The draft’s sign-offs were withdrawn.` : `Removed “${title}”.`),
                          onError: (err) => setRemoveError(errorMessage(err)),
                        },
                      );
                    }}
                  >
                    Remove
                  </Button>
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      <p role="status" className="text-sm font-bold empty:hidden">
        {message}
      </p>
    </>
  );
}

/** "Diagrams and photos": the procedure-level files, and for a writer on a draft the upload form. */
export function DiagramsSection({ revision: r, canEdit }: { revision: RevisionDto; canEdit: boolean }) {
  const [adding, setAdding] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const files = procedureLevel(r);
  const editable = canEdit && r.status === 'draft';
  return (
    <div className="flex min-w-0 flex-col gap-3">
      {files.length === 0 ? (
        <p className="text-ink-muted">
          No diagrams or photos for the whole procedure.
          {r.attachments.length ? ' Files for single steps are shown under those steps.' : ''}
        </p>
      ) : (
        <AttachmentList revision={r} attachments={files} canEdit={canEdit} label="Diagrams and photos for the whole procedure" />
      )}
      <p role="status" className="text-sm font-bold empty:hidden">
        {message}
      </p>
      {editable ? (
        adding ? (
          <AttachmentUploadForm
            revision={r}
            onCancel={() => setAdding(false)}
            onDone={(m) => {
              setAdding(false);
              setMessage(m);
            }}
          />
        ) : (
          <div className="hf-no-print">
            <Button
              onClick={() => {
                setMessage(null);
                setAdding(true);
              }}
            >
              Attach a diagram or photo
            </Button>
          </div>
        )
      ) : null}
    </div>
  );
}
