import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { EvidenceDto, MitigationDto } from '../../../contract/hazards';
import { formatBytes, UPLOAD_MAX_BYTES, UPLOAD_MAX_IN_WORDS, UPLOAD_TYPES, UPLOAD_TYPES_IN_WORDS } from '../../../contract/uploads';
import { Button } from '../../../components/ui/Button';
import { FieldError, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { UploadedFile } from '../../../components/ui/UploadedFile';
import { Notice } from '../../../components/ui/Notice';
import { Time } from '../../../components/ui/Time';
import { errorMessage, isApiError } from '../../../lib/api';
import { useRemoveEvidence } from '../api/removeEvidence';
import { useUploadEvidenceFile } from '../api/uploadEvidenceFile';
import { describeCalcEvidence, type Line } from '../lib/calcEvidence';
import { SourcesAndCautions } from './CalcCard';

// Media types let a phone offer its camera; extensions help desktop pickers. The server checks the bytes.
const ACCEPT = [...UPLOAD_TYPES.map((t) => t.mediaType), ...UPLOAD_TYPES.flatMap((t) => t.extensions.map((e) => `.${e}`))].join(',');
const LIMITS_IN_WORDS = `${UPLOAD_TYPES_IN_WORDS}; up to ${UPLOAD_MAX_IN_WORDS}. Holdfire checks the type from the file's content, not its name.`;

function Lines({ title, lines }: { title: string; lines: Line[] }) {
  if (lines.length === 0) return null;
  return (
    <div className="min-w-0">
      <h5 className="font-bold">{title}</h5>
      <dl className="text-sm">
        {lines.map((l) => (
          <div key={l.label} className="flex flex-wrap justify-between gap-x-3 border-b border-line-soft py-1 last:border-b-0">
            <dt className="text-ink-muted">{l.label}</dt>
            <dd className="ml-auto text-right font-bold [overflow-wrap:anywhere]">{l.value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

function Added({ ev }: { ev: EvidenceDto }) {
  return (
    <>
      added <Time value={ev.createdAt} />
      {ev.addedBy ? <> by {ev.addedBy}</> : null}
    </>
  );
}

function FileEvidence({ ev }: { ev: EvidenceDto }) {
  return (
    <UploadedFile file={ev.file!} title={ev.label} imageWord="Photo">
      <p className="text-sm text-ink-muted">
        File, <Added ev={ev} />
      </p>
    </UploadedFile>
  );
}

function CalcEvidence({ ev }: { ev: EvidenceDto }) {
  const d = describeCalcEvidence(ev.data);
  return (
    <div className="flex min-w-0 flex-col gap-2">
      <div>
        <p className="font-bold [overflow-wrap:anywhere]">{ev.label}</p>
        <p className="text-sm text-ink-muted">
          Frozen result of the {d.title.toLowerCase()} check
          {d.computedAt ? (
            <>
              , calculated <Time value={d.computedAt} />
            </>
          ) : null}
          {ev.addedBy ? <> by {ev.addedBy}</> : null}
        </p>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Lines title="Inputs" lines={d.inputs} />
        <Lines title="Results" lines={d.outputs} />
      </div>
      {d.sources.length || d.cautions.length ? (
        <details className="text-sm">
          <summary className="cursor-pointer font-bold">Sources and cautions at the time</summary>
          <div className="mt-2 flex flex-col gap-2">
            <SourcesAndCautions sources={d.sources} cautions={d.cautions} />
          </div>
        </details>
      ) : null}
    </div>
  );
}

interface UploadValues {
  file: FileList | undefined;
  label: string;
}

function EvidenceUploadForm({ hazardId, mitigation, onDone, onCancel }: { hazardId: number; mitigation: MitigationDto; onDone: (name: string) => void; onCancel: () => void }) {
  const upload = useUploadEvidenceFile();
  const form = useForm<UploadValues>({ defaultValues: { file: undefined, label: '' } });
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
      await upload.mutateAsync({ hazardId, mitigationId: mitigation.id, file, label: values.label });
      onDone(values.label.trim() || file.name);
    } catch (error) {
      const details = isApiError(error) ? error.details : [];
      const label = details.find((d) => d.path === 'label');
      if (label) form.setError('label', { message: label.message });
      else if (isApiError(error) && (details.some((d) => d.path === 'file') || error.status === 413 || error.status === 415)) setFileError(error.message);
      else setFormError(errorMessage(error));
    }
  });

  const describedBy = [`${id}-hint`, fileError ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <Form onSubmit={(ev) => void submit(ev)} aria-label={`Add a file as evidence for: ${mitigation.description.slice(0, 60)}`} className="rounded-md border-2 border-line-soft p-3">
      <FormError title="File not added" message={formError} />
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
        label="Label (optional)"
        hint="What it shows, e.g. “Burst disc fitted, serial number visible”. Without a label the file name is used."
        maxLength={200}
        autoComplete="off"
        error={e.label?.message}
        {...form.register('label', { maxLength: { value: 200, message: 'Use at most 200 characters' } })}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={upload.isPending} pendingLabel="Uploading…">
          Upload file
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </FormActions>
    </Form>
  );
}

/**
 * A mitigation's evidence: photos and documents, and frozen calculator results. Everyone signed in reads it;
 * safety officers and admins add files and remove evidence.
 */
export function EvidencePanel({ hazardId, mitigation, canEdit }: { hazardId: number; mitigation: MitigationDto; canEdit: boolean }) {
  const remove = useRemoveEvidence();
  const [adding, setAdding] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [removeError, setRemoveError] = useState<string | null>(null);
  const headingId = useId();
  const short = mitigation.description.slice(0, 60);

  return (
    <div className="mt-3 flex flex-col gap-2 border-t-2 border-line-soft pt-3">
      <h4 id={headingId} className="font-bold">
        Evidence
      </h4>
      {removeError ? (
        <Notice tone="danger" title="Evidence not removed">
          <p>{removeError}</p>
        </Notice>
      ) : null}
      {mitigation.evidence.length === 0 ? (
        <p className="text-ink-muted">No evidence attached yet.</p>
      ) : (
        <ul aria-labelledby={headingId} className="flex flex-col gap-3">
          {mitigation.evidence.map((ev) => (
            <li key={ev.id} className="flex min-w-0 flex-col gap-2 rounded-md border-2 border-line-soft bg-sunken p-3">
              {ev.kind === 'file' && ev.file ? <FileEvidence ev={ev} /> : <CalcEvidence ev={ev} />}
              {canEdit ? (
                <div className="hf-no-print">
                  <Button
                    variant="danger"
                    aria-label={`Remove evidence: ${ev.label.slice(0, 80)}`}
                    pending={remove.isPending && remove.variables?.evidenceId === ev.id}
                    pendingLabel="Removing…"
                    onClick={() => {
                      const what = ev.kind === 'file' ? 'The file is deleted from Holdfire; the history keeps its name and checksum.' : 'The history keeps a record of it.';
                      if (!window.confirm(`Remove the evidence “${ev.label}”? ${what}`)) return;
                      setRemoveError(null);
                      setMessage(null);
                      remove.mutate(
                        { hazardId, evidenceId: ev.id },
                        { onSuccess: () => setMessage(`Removed “${ev.label}”.`), onError: (err) => setRemoveError(errorMessage(err)) },
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
      )}
      <p role="status" className="text-sm font-bold empty:hidden">
        {message}
      </p>
      {canEdit ? (
        adding ? (
          <EvidenceUploadForm
            hazardId={hazardId}
            mitigation={mitigation}
            onCancel={() => setAdding(false)}
            onDone={(name) => {
              setAdding(false);
              setMessage(`Added “${name}”.`);
            }}
          />
        ) : (
          <div className="hf-no-print">
            <Button
              onClick={() => {
                setMessage(null);
                setAdding(true);
              }}
              aria-label={`Add a file as evidence for: ${short}`}
            >
              Add a file
            </Button>
          </div>
        )
      ) : null}
    </div>
  );
}
