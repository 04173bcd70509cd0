import { Badge } from './Badge';
import { Page } from './Page';

/**
 * An honest placeholder for an area that is planned but not built. It says what will be here and shows
 * no sample data, so nobody mistakes a mock-up for a real register or log.
 */
export function PlannedPage({ title, summary, planned }: { title: string; summary: string; planned: readonly string[] }) {
  return (
    <Page title={title} kicker="Planned">
      <div className="max-w-prose space-y-4">
        <p>
          <Badge tone="caution" glyph="clock">
            Not built yet
          </Badge>
        </p>
        <p className="text-lg">{summary}</p>
        <h2 className="text-2xl font-bold">What will be here</h2>
        <ul className="list-disc space-y-1 pl-6">
          {planned.map((item) => (
            <li key={item}>{item}</li>
          ))}
        </ul>
        <p className="text-ink-muted">Nothing on this page is recorded or stored yet.</p>
      </div>
    </Page>
  );
}
