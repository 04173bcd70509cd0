import { PlannedPage } from '../../../components/ui/PlannedPage';

export function LiveCountPage() {
  return (
    <PlannedPage
      title="Live count"
      summary="The live countdown, run by the test conductor and followed by every station, will live here."
      planned={[
        'The conductor steps through an approved procedure, calls holds and resumes the count.',
        'Go/no-go polls that each station answers from a phone or laptop, with who answered and when.',
        'Every call, answer, hold and abort written to the count log as it happens.',
      ]}
    />
  );
}
