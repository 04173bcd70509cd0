import { PlannedPage } from '../../../components/ui/PlannedPage';

export function ProceduresPage() {
  return (
    <PlannedPage
      title="Procedures"
      summary="Step-by-step procedures for each test, written by the team and approved before use, will live here."
      planned={[
        'Numbered steps with the station that performs each one, including planned holds and go/no-go polls.',
        'Versions: a count always runs against one approved version, and changes need a new approval.',
        'Links from steps to the hazard controls they verify.',
      ]}
    />
  );
}
