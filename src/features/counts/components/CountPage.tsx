import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useCount } from '../api/getCount';
import { useLiveCount } from '../hooks/useLiveCount';
import { ConductorConsole } from './ConductorConsole';
import { StationPanel } from './StationPanel';
import { RecordCheck } from './RecordCheck';
import { WatchView } from './WatchView';

type View = 'console' | 'station' | 'watch';

/** One count: the conductor's console, a station's panel or the watch view, by role and crew (switchable). */
export function CountPage() {
  const { id } = useParams();
  const countId = Number(id);
  const me = useSignedInMe();
  const count = useCount(countId);
  const live = useLiveCount(countId, count.data?.state);
  const [params] = useSearchParams();

  const state = live.state;
  const title = state?.plan?.name ?? count.data?.name ?? 'Count';
  if (!Number.isInteger(countId) || countId <= 0) {
    return (
      <Page title="No such count">
        <p>That address does not name a count.</p>
      </Page>
    );
  }
  if (!state?.plan) {
    const error = count.error ? errorMessage(count.error) : live.joinError;
    return (
      <Page title={title} kicker="Live count">
        {error ? (
          <Notice tone="danger" title="Could not open this count">
            <p>{error}</p>
          </Notice>
        ) : (
          <Loading label="Opening the count…" />
        )}
      </Page>
    );
  }

  const manned = state.plan.crew.filter((c) => c.userIds.includes(me.id)).map((c) => c.station);
  const allowed: View[] = [...(me.roles.includes('conductor') ? (['console'] as const) : []), ...(manned.length ? (['station'] as const) : []), 'watch'];
  const asked = params.get('view') as View | null;
  const view: View = asked && allowed.includes(asked) ? asked : allowed[0];
  const station = manned.includes(params.get('station') ?? '') ? params.get('station')! : manned[0];
  const names: Record<View, string> = { console: 'Conductor console', station: 'Station panel', watch: 'Watch' };

  return (
    <Page
      title={title}
      kicker={`Live count · ${count.data?.procedureName ?? 'procedure'} rev. ${state.plan.revisionNumber} · ${names[view]}${view === 'station' ? ` ${station}` : ''}`}
      actions={
        allowed.length > 1 || manned.length > 1 ? (
          <nav aria-label="Views" className="flex flex-wrap gap-2">
            {allowed.flatMap((v) =>
              v === 'station'
                ? manned.map((s) => (
                    <Link key={`station-${s}`} to={`?view=station&station=${s}`} aria-current={view === 'station' && station === s ? 'page' : undefined} className="font-bold">
                      Station {s}
                    </Link>
                  ))
                : [
                    <Link key={v} to={`?view=${v}`} aria-current={view === v ? 'page' : undefined} className="font-bold">
                      {names[v]}
                    </Link>,
                  ],
            )}
          </nav>
        ) : undefined
      }
    >
      {view === 'console' ? <ConductorConsole live={live} me={me} manned={manned} countId={countId} /> : null}
      {view === 'station' ? <StationPanel live={live} me={me} station={station} manned={manned} /> : null}
      {view === 'watch' ? <WatchView live={live} /> : null}
      {view !== 'station' ? <RecordCheck countId={countId} /> : null}
    </Page>
  );
}
