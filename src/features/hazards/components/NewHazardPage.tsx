import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Page, Loading } from '../../../components/ui/Page';
import { Notice } from '../../../components/ui/Notice';
import type { AnomalyDto } from '../../../contract/anomalies';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useCreateHazard } from '../api/createHazard';
import { useCreateHazardFromAnomaly } from '../api/createHazardFromAnomaly';
import { useAnomalyForHazard } from '../api/getAnomalyForHazard';
import { canEditHazards } from '../lib/labels';
import { HazardForm, type HazardFormValues } from './HazardForm';

/** The hazard form's starting values from an anomaly: its title, what happened as the cause, and a link back. */
export function prefillFromAnomaly(a: AnomalyDto): Partial<HazardFormValues> {
  const cut = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
  return {
    title: cut(a.title, 200),
    description: cut(`Raised from anomaly ${a.ref} (${a.title}).\n\n${a.description}`, 4000),
    causes: [cut(a.description, 500)],
    effects: a.immediateActions ? [cut(`Seen in ${a.ref}; immediate actions: ${a.immediateActions}`, 500)] : [cut(`Seen in ${a.ref}`, 500)],
    phase: (a.countId !== null ? 'firing' : '') as HazardFormValues['phase'],
    matrixId: a.matrixId,
    initialSeverity: String(a.severity),
  };
}

export function NewHazardPage() {
  const me = useSignedInMe();
  const [params] = useSearchParams();
  const raw = params.get('anomaly');
  const anomalyId = raw && /^[1-9]\d{0,8}$/.test(raw) ? Number(raw) : null;
  if (!canEditHazards(me.roles)) {
    return (
      <Page title="You cannot add hazards" kicker="403 · Not allowed">
        <Notice tone="warning" title="This page needs another role">
          <p>Only a Safety officer or an Administrator can add hazards. Everyone signed in can read the register.</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards">Back to the register</Link>
        </p>
      </Page>
    );
  }
  return anomalyId === null ? <PlainNewHazard /> : <NewHazardFromAnomaly anomalyId={anomalyId} />;
}

function PlainNewHazard() {
  const create = useCreateHazard();
  const navigate = useNavigate();
  return (
    <Page title="New hazard" kicker="Hazards" narrow>
      <p className="mb-4">
        <Link to="/hazards">Back to the register</Link>
      </p>
      <HazardForm
        submitLabel="Add hazard"
        pendingLabel="Adding…"
        onSubmit={(input) => create.mutateAsync(input).then((h) => navigate(`/hazards/${h.id}`))}
      />
    </Page>
  );
}

function NewHazardFromAnomaly({ anomalyId }: { anomalyId: number }) {
  const anomaly = useAnomalyForHazard(anomalyId);
  const create = useCreateHazardFromAnomaly();
  const navigate = useNavigate();
  if (anomaly.isPending) return <Loading label="Loading the anomaly…" />;
  if (anomaly.isError)
    return (
      <Page title="New hazard" kicker="Hazards" narrow>
        <Notice tone="danger" title="Could not load the anomaly">
          <p>{errorMessage(anomaly.error)}</p>
        </Notice>
      </Page>
    );
  const a = anomaly.data;
  return (
    <Page title="New hazard from an anomaly" kicker="Hazards" narrow>
      <p className="mb-4">
        <Link to={`/anomalies/${a.id}`}>Back to {a.ref}</Link>
      </p>
      <Notice tone="info" title={`From ${a.ref}: ${a.title}`} className="mb-4">
        <p>The form starts with the anomaly's values. Check them, choose the system, phase and likelihood; on saving, the hazard is added to the register and linked to {a.ref}.</p>
      </Notice>
      <HazardForm
        prefill={prefillFromAnomaly(a)}
        submitLabel="Add hazard and link it"
        pendingLabel="Adding…"
        onSubmit={(input) => create.mutateAsync({ anomalyId: a.id, input }).then(() => navigate(`/anomalies/${a.id}`))}
      />
    </Page>
  );
}
