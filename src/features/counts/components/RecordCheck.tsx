import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import type { CountEventDto } from '../../../contract/count';
import { verifyChain, type ChainedEvent, type ChainVerdict } from '../../../domain/count/chain';
import { api, errorMessage } from '../../../lib/api';
import { webSha256 } from '../../../lib/sha256';

type ServerVerdict = ChainVerdict & { lastHash?: string | null };

const REASON_WORDS: Record<Exclude<ChainVerdict, { ok: true }>['reason'], string> = {
  'hash-mismatch': 'this event’s content was changed after it was written',
  'prev-hash-mismatch': 'an earlier event was changed and its hash rewritten to hide it',
  'seq-gap': 'an event before this one is missing',
  'wrong-count': 'an event of another count is mixed in',
};

function words(v: ChainVerdict): string {
  return v.ok ? `intact: ${v.count} events, each chained to the one before` : `BROKEN at event #${v.seq}: ${REASON_WORDS[v.reason]}`;
}

/**
 * Is the record unchanged? Recomputes the count log's SHA-256 chain in this browser (Web Crypto) and asks the
 * server to do the same; shows both verdicts, the last hash to keep elsewhere, and the export files.
 */
export function RecordCheck({ countId }: { countId: number }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [result, setResult] = useState<{ browser: ChainVerdict | null; server: ServerVerdict; lastHash: string | null } | null>(null);

  async function check() {
    setBusy(true);
    setError(null);
    try {
      const [events, server] = await Promise.all([
        api.get<CountEventDto[]>(`/api/counts/${countId}/events`),
        api.get<ServerVerdict>(`/api/counts/${countId}/verify`),
      ]);
      const sha256 = webSha256();
      const browser = sha256 ? await verifyChain(events as unknown as ChainedEvent[], sha256) : null;
      setResult({ browser, server, lastHash: events.at(-1)?.hash ?? null });
    } catch (e) {
      setError(errorMessage(e));
    } finally {
      setBusy(false);
    }
  }

  const broken = result && (!result.server.ok || (result.browser && !result.browser.ok));
  return (
    <section aria-label="Record check" className="flex flex-col gap-2 rounded-md border-2 border-line bg-surface p-3">
      <h2 className="text-xl font-bold">Is the record unchanged?</h2>
      <p className="text-sm text-ink-muted">
        Each event of this count is sealed with a SHA-256 hash over the one before it. The check recomputes every hash, here in
        your browser and on the server.
      </p>
      <div className="flex flex-wrap items-center gap-2">
        <Button onClick={() => void check()} pending={busy} pendingLabel="Checking…">
          Check the record
        </Button>
        <Link className="font-bold underline" to={`/counts/${countId}/report`}>
          Count report
        </Link>
        <Link className="font-bold underline" to={`/counts/${countId}/replay`}>
          Replay
        </Link>
        <a className="font-bold underline" href={`/api/counts/${countId}/export?format=jsonl`} download>
          Download the log (JSON Lines)
        </a>
        <a className="font-bold underline" href={`/api/counts/${countId}/export?format=csv`} download>
          Download the log (CSV)
        </a>
      </div>
      {error ? <p role="alert" className="font-bold text-danger">{error}</p> : null}
      {result ? (
        <div role="status" className={`rounded-md border-2 p-2 ${broken ? 'border-danger' : 'border-line'}`}>
          <p className="font-bold">
            {result.browser ? `Checked in this browser: ${words(result.browser)}.` : 'This browser cannot compute SHA-256 here (it needs HTTPS); only the server checked.'}
          </p>
          <p className="font-bold">Checked on the server: {words(result.server)}.</p>
          {result.lastHash ? (
            <p className="text-sm">
              Last hash (keep it elsewhere to notice a log cut short later): <code className="break-all">{result.lastHash}</code>
            </p>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}
