import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { buttonClasses } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { useSignedInMe } from '../../../lib/session';
import { useProcedure } from '../api/getProcedure';
import { useRevision } from '../api/getRevision';
import { useHazardOptions } from '../api/listHazardOptions';
import { useStations } from '../api/listStations';
import { canWriteProcedures, idParam } from '../lib/format';
import { DraftEditor } from './DraftEditor';
import { ProcedureLoadError, ProcedureMissing } from './ProcedurePage';
import { ProceduresNav } from './ProceduresNav';
import { RevisionBadge } from './RevisionBadge';

export function DraftEditorPage() {
  const params = useParams();
  const id = idParam(params.id);
  const rev = idParam(params.rev);
  if (id === null || rev === null) return <ProcedureMissing message="There is no revision at this address." />;
  return <DraftEditorLoader id={id} rev={rev} />;
}

function DraftEditorLoader({ id, rev }: { id: number; rev: number }) {
  const me = useSignedInMe();
  const canWrite = canWriteProcedures(me.roles);
  const procedure = useProcedure(id);
  const revision = useRevision(id, rev);
  const stations = useStations();
  const hazards = useHazardOptions();
  const refs = useMemo(
    () => (stations.data && hazards.data ? { stations: new Set(stations.data.map((s) => s.code)), hazardIds: new Set(hazards.data.map((h) => h.id)) } : null),
    [stations.data, hazards.data],
  );

  if (procedure.isPending || revision.isPending) return <Loading label="Loading the draft…" />;
  if (procedure.isError) return <ProcedureLoadError error={procedure.error} retry={() => void procedure.refetch()} />;
  if (revision.isError) return <ProcedureLoadError error={revision.error} retry={() => void revision.refetch()} />;
  const p = procedure.data;
  const r = revision.data;
  const back = (
    <Link to={`/procedures/${p.id}/revisions/${r.number}`} className={buttonClasses('secondary')}>
      Read revision {r.number}
    </Link>
  );

  return (
    <Page title={`Edit revision ${r.number}`} kicker={p.name} documentTitle={`${p.name}, editing revision ${r.number}`}>
      <ProceduresNav />
      <p className="mb-4 flex flex-wrap items-center gap-3">
        <RevisionBadge status={r.status} number={r.number} />
        <Link to={`/procedures/${p.id}`}>Back to the procedure</Link>
      </p>
      {!canWrite ? (
        <Notice tone="info" title="Read only">
          <p>Your roles let you read procedures but not change them. Test conductors, safety officers and administrators edit drafts.</p>
          <p className="mt-2">{back}</p>
        </Notice>
      ) : r.status !== 'draft' ? (
        <Notice tone="info" title={`Revision ${r.number} is released and read-only`}>
          <p>A released revision is frozen. To change the procedure, open a new draft from the procedure page: it starts as a copy of the latest revision.</p>
          <p className="mt-2 flex flex-wrap gap-2">
            {back}
            <Link to={`/procedures/${p.id}`} className={buttonClasses('primary')}>
              Go to the procedure
            </Link>
          </p>
        </Notice>
      ) : stations.isError || hazards.isError ? (
        <Notice tone="danger" title="Could not load the stations or the hazard register">
          <p>The editor needs both to check the steps. Reload the page to try again.</p>
        </Notice>
      ) : !refs || !stations.data || !hazards.data ? (
        <Loading label="Loading stations and hazards…" />
      ) : (
        // A fresh editor for each revision (after discarding one, say).
        <DraftEditor key={r.id} revision={r} stations={stations.data} hazards={hazards.data} refs={refs} />
      )}
    </Page>
  );
}
