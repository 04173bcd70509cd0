import { Link, useParams } from 'react-router-dom';
import { Badge } from '../../../components/ui/Badge';
import { buttonClasses } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { useSignedInMe } from '../../../lib/session';
import { useProcedure } from '../api/getProcedure';
import { revisionExportUrl, useRevision } from '../api/getRevision';
import { useHazardOptions } from '../api/listHazardOptions';
import { useStations } from '../api/listStations';
import { stepTotal } from '../lib/draft';
import { canWriteProcedures, idParam } from '../lib/format';
import { AttachmentList, attachmentsOfStep, DiagramsSection } from './Attachments';
import { ProcedureLoadError, ProcedureMissing } from './ProcedurePage';
import { ProceduresNav } from './ProceduresNav';
import { RevisionBadge } from './RevisionBadge';
import { SignoffPanel } from './SignoffPanel';
import { makeLookups, PhaseList } from './StepView';

export function RevisionPage() {
  const params = useParams();
  const id = idParam(params.id);
  const rev = idParam(params.rev);
  if (id === null || rev === null) return <ProcedureMissing message="There is no revision at this address." />;
  return <RevisionView id={id} rev={rev} />;
}

function RevisionView({ id, rev }: { id: number; rev: number }) {
  const me = useSignedInMe();
  const canWrite = canWriteProcedures(me.roles);
  const procedure = useProcedure(id);
  const revision = useRevision(id, rev);
  const stations = useStations();
  const hazards = useHazardOptions();

  if (procedure.isPending || revision.isPending) return <Loading label="Loading revision…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  if (revision.isError) return <ProcedureLoadError error={revision.error} retry={() => void revision.refetch()} />;
  const p = procedure.data;
  const r = revision.data;
  const lookups = makeLookups(stations.data, hazards.data);
  const draft = r.status === 'draft';
  const steps = stepTotal(r.phases);
  const others = p.revisions.filter((x) => x.number !== r.number);

  return (
    <Page
      title={p.name}
      documentTitle={`${p.name}, revision ${r.number}`}
      kicker={`Procedure · revision ${r.number}`}
      actions={
        <>
          {draft && canWrite ? (
            <Link to={`/procedures/${p.id}/revisions/${r.number}/edit`} className={buttonClasses('primary')}>
              Edit draft
            </Link>
          ) : null}
          <Link to={`/procedures/${p.id}/revisions/${r.number}/print`} className={buttonClasses('secondary')}>
            Printable copy
          </Link>
        </>
      }
    >
      <ProceduresNav />
      <div className="mb-4 flex flex-wrap items-center gap-x-3 gap-y-2">
        <RevisionBadge status={r.status} number={r.number} />
        {r.countable ? (
          <Badge tone="go" glyph="circle">
            Can be counted
          </Badge>
        ) : (
          <Badge tone="neutral" glyph="cross">
            Cannot be counted
          </Badge>
        )}
        <span>
          {steps} step{steps === 1 ? '' : 's'} in {r.phases.length} phase{r.phases.length === 1 ? '' : 's'}
        </span>
        <a href="#release">{draft ? 'Sign-offs and release' : 'Who signed'}</a>
        <Link to={`/procedures/${p.id}`}>Back to the procedure</Link>
      </div>
      {r.notCountableReason ? <p className="mb-4 max-w-prose">{r.notCountableReason}</p> : null}
      {r.cautionsChangedSinceRelease ? (
        <Notice tone="warning" title="Cautions have changed since this revision was released" className="mb-4">
          <p>
            The hazard register or the propellant cautions changed after release. This revision shows the cautions it was signed with. Open a
            new draft to bring the current ones in, and have it signed again.
          </p>
        </Notice>
      ) : null}

      <div className="flex flex-col gap-6">
        <div className="hf-no-print flex flex-wrap items-center gap-3">
          <a href={revisionExportUrl(p.id, r.number)} download className={buttonClasses('secondary')}>
            Export revision {r.number} as JSON
          </a>
          {others.length ? (
            <Link
              to={`/procedures/${p.id}/diff?from=${Math.min(r.number, others[others.length - 1]!.number)}&to=${Math.max(r.number, others[others.length - 1]!.number)}`}
              className={buttonClasses('quiet')}
            >
              Compare with another revision
            </Link>
          ) : null}
        </div>

        {r.phases.length > 1 ? (
          <nav aria-label="Phases of this revision" className="hf-no-print">
            <ol className="flex flex-wrap gap-2">
              {r.phases.map((ph, i) => (
                <li key={ph.key}>
                  <a href={`#phase-${ph.key}`} className="inline-flex min-h-11 items-center rounded-md border-2 border-line-soft px-3 font-bold text-ink no-underline hover:border-line">
                    {i + 1}. {ph.name}
                  </a>
                </li>
              ))}
            </ol>
          </nav>
        ) : null}

        <section aria-labelledby="diagrams" className="min-w-0">
          <h2 id="diagrams" className="mb-3 border-b-2 border-line pb-1 text-2xl font-bold">
            Diagrams and photos
          </h2>
          <DiagramsSection revision={r} canEdit={canWrite} />
        </section>

        {steps === 0 && r.phases.length === 0 ? (
          <p>
            This revision has no phases or steps yet.
            {draft && canWrite ? (
              <>
                {' '}
                <Link to={`/procedures/${p.id}/revisions/${r.number}/edit`}>Open the editor</Link> to write them.
              </>
            ) : null}
          </p>
        ) : (
          <PhaseList
            phases={r.phases}
            lookups={lookups}
            stepExtra={(step, n) => {
              const files = attachmentsOfStep(r, step.key);
              return files.length ? (
                <div className="mt-3 border-t-2 border-line-soft pt-3">
                  <AttachmentList revision={r} attachments={files} canEdit={canWrite} label={`Diagrams and photos for step ${n}`} />
                </div>
              ) : null;
            }}
          />
        )}

        <div id="release" tabIndex={-1}>
          <Section title={draft ? 'Release' : 'Sign-offs'}>
            <SignoffPanel revision={r} me={me} />
          </Section>
        </div>
      </div>
    </Page>
  );
}
