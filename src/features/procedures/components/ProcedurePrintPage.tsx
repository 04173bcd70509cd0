import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import type { AttachmentDto, ProcedureDto, RevisionDto } from '../../../contract/procedures';
import { isImageType } from '../../../contract/uploads';
import { SIGNOFF_ROLES } from '../../../domain/procedures/release';
import { formatDateTime } from '../../../lib/dates';
import { useProcedure } from '../api/getProcedure';
import { useRevision } from '../api/getRevision';
import { useHazardOptions } from '../api/listHazardOptions';
import { useStations } from '../api/listStations';
import { stepTotal } from '../lib/draft';
import { idParam, kindLabel, RELEASE_CAUTION, SIGNOFF_LABELS } from '../lib/format';
import { attachmentsOfStep, attachmentTitle, procedureLevel } from './Attachments';
import { CautionList } from './CautionList';
import { ProcedureLoadError, ProcedureMissing } from './ProcedurePage';
import { firstNumbers, makeLookups, StepDetails, TimeMark, type Lookups } from './StepView';

/**
 * The paper copy kept at the stand: paper colours and no app chrome under @media print (styles.css), the
 * cautions beside each step, a tick box per step, and sign-off blocks to sign by hand.
 */
export function ProcedurePrintPage() {
  const params = useParams();
  const id = idParam(params.id);
  const rev = idParam(params.rev);
  if (id === null || rev === null) return <ProcedureMissing message="There is no revision at this address." />;
  return <PrintView id={id} rev={rev} />;
}

function PrintView({ id, rev }: { id: number; rev: number }) {
  const procedure = useProcedure(id);
  const revision = useRevision(id, rev);
  const stations = useStations();
  const hazards = useHazardOptions();
  useEffect(() => {
    if (procedure.data && revision.data) document.title = `${procedure.data.name}, revision ${revision.data.number} (printable) · Holdfire`;
  }, [procedure.data, revision.data]);

  if (procedure.isPending || revision.isPending) return <Loading label="Loading revision…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  if (revision.isError) return <ProcedureLoadError error={revision.error} retry={() => void revision.refetch()} />;
  const p = procedure.data;
  const r = revision.data;
  return (
    <div>
      <div className="hf-no-print mb-4 flex flex-wrap items-center gap-3">
        <Button variant="primary" onClick={() => window.print()}>
          Print this procedure
        </Button>
        <Link to={`/procedures/${p.id}/revisions/${r.number}`}>Back to revision {r.number}</Link>
      </div>
      <PrintedProcedure procedure={p} revision={r} lookups={makeLookups(stations.data, hazards.data)} />
    </div>
  );
}

/** The whole procedure's diagrams and photos, at a readable size, before the steps. */
function PrintedAttachments({ attachments }: { attachments: AttachmentDto[] }) {
  if (attachments.length === 0) return null;
  return (
    <section aria-labelledby="print-diagrams" className="hf-print-avoid-break">
      <h2 id="print-diagrams" className="mb-2 text-2xl font-bold">
        Diagrams and photos
      </h2>
      <ul className="flex flex-wrap gap-4">
        {attachments.map((a) => (
          <li key={a.id} className="min-w-0 max-w-full">
            <figure className="flex min-w-0 flex-col gap-1">
              {isImageType(a.file.mediaType) ? (
                <img src={a.file.url} alt={`Image: ${attachmentTitle(a)}`} className="hf-evidence-image block h-auto max-h-64 w-auto max-w-full border-2 border-line object-contain" />
              ) : null}
              <figcaption className="text-sm [overflow-wrap:anywhere]">
                <span className="font-bold">{attachmentTitle(a)}</span>
                {isImageType(a.file.mediaType) ? null : <> — file {a.file.name}, kept in Holdfire</>}
                {a.stepRemoved ? <> (its step is no longer in this revision)</> : null}
              </figcaption>
            </figure>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** A step's own files, small, inside its row: images as thumbnails, other files by name. */
function StepFiles({ attachments, number }: { attachments: AttachmentDto[]; number: number }) {
  if (attachments.length === 0) return null;
  return (
    <ul aria-label={`Diagrams and photos for step ${number}`} className="mt-2 flex flex-wrap gap-2">
      {attachments.map((a) => (
        <li key={a.id} className="min-w-0 max-w-[12rem]">
          {isImageType(a.file.mediaType) ? (
            <img src={a.file.url} alt={`Image: ${attachmentTitle(a)}`} className="hf-evidence-image block h-auto max-h-28 w-auto max-w-full border-2 border-line object-contain" />
          ) : null}
          <span className="block text-xs [overflow-wrap:anywhere]">
            {attachmentTitle(a)}
            {isImageType(a.file.mediaType) ? null : ` (file ${a.file.name}, kept in Holdfire)`}
          </span>
        </li>
      ))}
    </ul>
  );
}

export function PrintedProcedure({ procedure: p, revision: r, lookups }: { procedure: ProcedureDto; revision: RevisionDto; lookups: Lookups }) {
  const draft = r.status === 'draft';
  const starts = firstNumbers(r.phases);
  const printedAt = formatDateTime(new Date());
  return (
    <article className="flex flex-col gap-5">
      {draft ? (
        <div className="hf-watermark" aria-hidden="true">
          DRAFT
        </div>
      ) : null}
      <header className="border-b-4 border-line pb-3">
        <p className="text-sm font-bold uppercase tracking-wider text-ink-muted">Procedure · printed from Holdfire {printedAt}</p>
        <h1 className="text-3xl font-bold leading-tight">{p.name}</h1>
        <p className="mt-2 flex flex-wrap items-center gap-3">
          <span className="text-xl font-bold">Revision {r.number}</span>
          {draft ? (
            <span className="rounded-sm border-4 border-double border-danger px-3 py-0.5 text-xl font-bold uppercase tracking-widest text-danger">
              Draft — not for use in a count
            </span>
          ) : (
            <span className="rounded-sm border-[3px] border-line px-3 py-0.5 text-xl font-bold uppercase tracking-widest">Released</span>
          )}
        </p>
        <dl className="mt-3 grid gap-x-4 gap-y-1 sm:grid-cols-[max-content_minmax(0,1fr)]">
          {p.testArticle ? (
            <>
              <dt className="font-bold">Test article</dt>
              <dd>{p.testArticle}</dd>
            </>
          ) : null}
          {p.site ? (
            <>
              <dt className="font-bold">Site</dt>
              <dd>{p.site}</dd>
            </>
          ) : null}
          <dt className="font-bold">Stations</dt>
          <dd>{r.neededStations.map((c) => (lookups.stationName(c) ? `${c} (${lookups.stationName(c)})` : c)).join(', ') || '—'}</dd>
          <dt className="font-bold">Steps</dt>
          <dd>
            {stepTotal(r.phases)} in {r.phases.length} phases
          </dd>
          {r.releasedAt ? (
            <>
              <dt className="font-bold">Released</dt>
              <dd>
                <Time value={r.releasedAt} />
              </dd>
            </>
          ) : null}
        </dl>
        {p.purpose ? <p className="mt-2 max-w-prose">{p.purpose}</p> : null}
      </header>

      <p className="hf-print-avoid-break border-2 border-line p-2 text-sm">{RELEASE_CAUTION} Anyone may call a hold at any time.</p>
      {r.cautionsChangedSinceRelease ? (
        <Notice tone="warning" title="Cautions have changed since release">
          <p>This copy shows the cautions the revision was signed with; the hazard register or propellant cautions have changed since.</p>
        </Notice>
      ) : null}

      <PrintedAttachments attachments={procedureLevel(r)} />

      {r.phases.map((phase, pi) => (
        <section key={phase.key} aria-labelledby={`print-phase-${phase.key}`} className="hf-print-page-flow">
          <h2 id={`print-phase-${phase.key}`} className="mb-2 text-2xl font-bold">
            {pi + 1}. {phase.name}
          </h2>
          {phase.steps.length === 0 ? (
            <p>No steps.</p>
          ) : (
            <div role="region" aria-label={`Steps of ${phase.name}`} tabIndex={0} className="overflow-x-auto">
              <table className="w-full min-w-[46rem] border-collapse text-left align-top print:min-w-0">
                <thead>
                  <tr>
                    <th scope="col" className="w-12 border-2 border-line p-1.5">
                      No.
                    </th>
                    <th scope="col" className="w-28 border-2 border-line p-1.5">
                      Time
                    </th>
                    <th scope="col" className="w-20 border-2 border-line p-1.5">
                      Station
                    </th>
                    <th scope="col" className="border-2 border-line p-1.5">
                      Step
                    </th>
                    <th scope="col" className="w-[38%] border-2 border-line p-1.5">
                      Cautions
                    </th>
                    <th scope="col" className="w-14 border-2 border-line p-1.5">
                      Done
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {phase.steps.map((step, si) => {
                    const n = starts[pi]! + si;
                    return (
                      <tr key={step.key} className="hf-print-step align-top" data-step-key={step.key} data-step-kind={step.kind}>
                        <td className="border-2 border-line p-1.5 font-bold">{n}</td>
                        <td className="border-2 border-line p-1.5">
                          <TimeMark tSeconds={step.tSeconds} className="text-base" />
                        </td>
                        <td className="border-2 border-line p-1.5 font-bold">{step.station}</td>
                        <td className="border-2 border-line p-1.5">
                          <span className="block text-sm font-bold">{kindLabel(step.kind)}</span>
                          <span className="block">{step.instruction}</span>
                          <StepDetails step={step} lookups={lookups} />
                          <StepFiles attachments={attachmentsOfStep(r, step.key)} number={n} />
                        </td>
                        <td className="border-2 border-line p-1.5">
                          <CautionList cautions={step.cautions} label={`Cautions for step ${n}`} compact />
                        </td>
                        <td className="border-2 border-line p-1.5">
                          <span className="block size-7 border-2 border-line" aria-label={`Tick box for step ${n}`} role="img" />
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          )}
        </section>
      ))}

      <section aria-labelledby="print-signoffs" className="hf-print-avoid-break">
        <h2 id="print-signoffs" className="mb-2 text-2xl font-bold">
          Sign-off
        </h2>
        <p className="mb-3 max-w-prose text-sm">
          Release needs a test conductor and a safety officer, two different people. Sign here for your site’s own record as well.
        </p>
        <div className="grid gap-4 md:grid-cols-2">
          {SIGNOFF_ROLES.map((role) => {
            const signed = r.signoffs.find((s) => s.role === role);
            return (
              <div key={role} className="flex flex-col gap-4 border-2 border-line p-3">
                <p className="text-lg font-bold">{SIGNOFF_LABELS[role]}</p>
                {['Printed name', 'Signature', 'Date'].map((line) => (
                  <p key={line} className="flex items-end gap-2">
                    <span className="w-28 shrink-0 font-bold">{line}</span>
                    <span className="block h-7 flex-1 border-b-2 border-line" />
                  </p>
                ))}
                <p className="text-sm">
                  {signed ? (
                    <>
                      Signed in Holdfire by {signed.userName}, <Time value={signed.at} />.
                    </>
                  ) : (
                    'Not signed in Holdfire.'
                  )}
                </p>
              </div>
            );
          })}
        </div>
      </section>
    </article>
  );
}
