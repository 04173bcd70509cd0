import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { buttonClasses, Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { errorMessage, isApiError } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useHazard } from '../api/getHazard';
import { useUpdateHazard } from '../api/updateHazard';
import { canEditHazards } from '../lib/labels';
import { HazardAnomalies } from './HazardAnomalies';
import { HazardFacts } from './HazardFacts';
import { HazardForm } from './HazardForm';
import { HazardsNav } from './HazardsNav';
import { HistoryPanel } from './HistoryPanel';
import { MitigationsPanel } from './MitigationsPanel';
import { StatusBadge } from './StatusBadge';
import { StatusPanel } from './StatusPanel';

function useHazardId(): number | null {
  const { id } = useParams();
  return id && /^[1-9]\d{0,8}$/.test(id) ? Number(id) : null;
}

export function HazardDetailPage() {
  const id = useHazardId();
  if (id === null) return <HazardMissing />;
  return <HazardDetail id={id} />;
}

function HazardMissing({ message = 'There is no hazard at this address.' }: { message?: string }) {
  return (
    <Page title="Hazard not found" kicker="Hazards">
      <Notice tone="warning" title="Not found">
        <p>{message}</p>
      </Notice>
      <p className="mt-4">
        <Link to="/hazards">Back to the register</Link>
      </p>
    </Page>
  );
}

function HazardDetail({ id }: { id: number }) {
  const me = useSignedInMe();
  const canEdit = canEditHazards(me.roles);
  const hazard = useHazard(id);
  const update = useUpdateHazard();
  const [editing, setEditing] = useState(false);

  if (hazard.isPending) return <Loading label="Loading hazard…" />;
  if (hazard.isError) {
    if (isApiError(hazard.error) && hazard.error.status === 404) return <HazardMissing message={hazard.error.message} />;
    return (
      <Page title="Hazard" kicker="Hazards">
        <Notice tone="danger" title="Could not load this hazard">
          <p>{errorMessage(hazard.error)}</p>
          <Button className="mt-2" onClick={() => void hazard.refetch()}>
            Try again
          </Button>
        </Notice>
      </Page>
    );
  }
  const h = hazard.data;
  const closed = h.status === 'closed';

  return (
    <Page
      title={`${h.code} ${h.title}`}
      kicker="Hazard"
      actions={
        <>
          <Link to={`/hazards/print/${h.id}`} className={buttonClasses('secondary')}>
            Printable report
          </Link>
          {canEdit && !editing && !closed ? (
            <Button variant="primary" onClick={() => setEditing(true)}>
              Edit hazard
            </Button>
          ) : null}
        </>
      }
    >
      <HazardsNav />
      <p className="mb-4 flex flex-wrap items-center gap-2">
        <StatusBadge status={h.status} />
        <Link to="/hazards">Back to the register</Link>
      </p>
      {canEdit && closed ? (
        <Notice tone="info" title="Closed" className="mb-4">
          <p>This hazard is closed. Reopen it (Status and acceptance, below) before changing it.</p>
        </Notice>
      ) : null}
      <div className="flex flex-col gap-6">
        <Section title={editing ? 'Edit hazard' : 'Details'}>
          {editing ? (
            <HazardForm
              initial={h}
              submitLabel="Save changes"
              pendingLabel="Saving…"
              onCancel={() => setEditing(false)}
              onSubmit={(input) => update.mutateAsync({ id: h.id, input }).then(() => setEditing(false))}
            />
          ) : (
            <HazardFacts hazard={h} />
          )}
        </Section>
        <Section title="Mitigations">
          <MitigationsPanel hazard={h} canEdit={canEdit && !closed} />
        </Section>
        <Section title="Status and acceptance">
          <StatusPanel hazard={h} me={me} canEdit={canEdit} />
        </Section>
        <Section title="Anomalies">
          <HazardAnomalies hazardId={h.id} />
        </Section>
        <Section title="History">
          <HistoryPanel hazardId={h.id} />
        </Section>
      </div>
    </Page>
  );
}
