/**
 * npm run verify-log -- FILE
 *
 * Verifies a count log exported from Holdfire (GET /api/counts/:id/export?format=jsonl or csv) with no server:
 * recomputes every event's SHA-256 over its predecessor's hash and its canonical form (docs/count-log.md).
 * Exit 0: intact. Exit 1: broken, naming the seq of the first bad event. Exit 2: the file cannot be read as an export.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { verifyChain } from '../src/domain/count/chain';
import { ExportFileError, parseExport } from '../server/counts/export';
import { sha256Hex } from '../server/counts/log';

async function main(): Promise<number> {
  const file = process.argv[2];
  if (!file) {
    console.error('Usage: npm run verify-log -- FILE   (a .jsonl or .csv export of a count log)');
    return 2;
  }
  let content: string;
  try {
    content = readFileSync(file, 'utf8');
  } catch (error) {
    console.error(`Cannot read ${file}: ${(error as Error).message}`);
    return 2;
  }
  let events;
  try {
    events = parseExport(content, path.basename(file));
  } catch (error) {
    console.error(`${file} is not a count log export: ${error instanceof ExportFileError ? error.message : String(error)}`);
    return 2;
  }
  if (events.length === 0) {
    console.error(`${file} holds no events.`);
    return 2;
  }
  const verdict = await verifyChain(events, sha256Hex);
  if (verdict.ok) {
    console.log(`intact: ${verdict.count} events of count ${events[0]!.countId}, seq 1 to ${events.at(-1)!.seq}; last hash ${events.at(-1)!.hash}`);
    return 0;
  }
  console.error(`BROKEN at seq ${verdict.seq}: ${verdict.reason} (${verdict.detail})`);
  return 1;
}

process.exitCode = await main();
