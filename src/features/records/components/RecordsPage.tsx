import { PlannedPage } from '../../../components/ui/PlannedPage';

export function RecordsPage() {
  return (
    <PlannedPage
      title="Replay and reports"
      summary="The record of past counts, for the team's review and for auditors, will live here."
      planned={[
        'Replay of a count log, step by step, with the time of every call and answer.',
        'Checks that show whether a log has been changed after the count.',
        'Reports to export for a test review.',
      ]}
    />
  );
}
