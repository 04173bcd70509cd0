import { Link, useNavigate } from 'react-router-dom';
import { Page } from '../../../components/ui/Page';
import { Notice } from '../../../components/ui/Notice';
import { useSignedInMe } from '../../../lib/session';
import { useCreateHazard } from '../api/createHazard';
import { canEditHazards } from '../lib/labels';
import { HazardForm } from './HazardForm';

export function NewHazardPage() {
  const me = useSignedInMe();
  const create = useCreateHazard();
  const navigate = useNavigate();
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
