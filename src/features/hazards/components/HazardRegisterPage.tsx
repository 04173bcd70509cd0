import { PlannedPage } from '../../../components/ui/PlannedPage';

export function HazardRegisterPage() {
  return (
    <PlannedPage
      title="Hazard register"
      summary="The safety officer's hazard analysis for each engine and test stand will live here."
      planned={[
        'Hazards per engine and stand, for example a LOX line leak or overpressure in a run tank.',
        'Causes, controls and how severe and how likely each hazard is before and after its controls.',
        'Controls that must be verified before a count can start, linked to the procedure steps that check them.',
        'Review and sign-off by the safety officer, with each change kept in the record.',
      ]}
    />
  );
}
