import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { EventLog } from '../../server/counts/log';
import { createCount, openCountDatabase } from '../helpers/count-log';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const writer = path.join(root, 'tests/helpers/count-log-writer.ts');
const ACKS_BEFORE_KILL = 150;
const WAIT_MS = 15_000;

/**
 * A writer process is killed with SIGKILL in the middle of appending. Every event it acknowledged must be in
 * the database afterwards, chained and gapless. SIGKILL loses the process, not the operating system's cache,
 * so this checks that acknowledgements follow commits; surviving a power cut is what synchronous=FULL is for
 * (server/db/index.ts), and no test here can cut the power.
 */
describe('count log after the writer is killed', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'holdfire-count-crash-'));
  const file = path.join(dir, 'holdfire.sqlite');
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  // Starting the child under tsx and waiting for its acks can take a while on a loaded machine; this bounds it.
  it('keeps every acknowledged event', { timeout: 30_000 }, async () => {
    const setup = await openCountDatabase(file);
    const countId = (await createCount()).id;
    await setup.close();

    const child = spawn(process.execPath, ['--import', 'tsx', writer, file, String(countId)], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    const acked = new Map<number, string>();
    let stderr = '';
    let buffer = '';
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    // 'close' comes after the exit and after stdout has delivered everything the child wrote.
    const exited = new Promise<NodeJS.Signals | number | null>((resolve) => child.on('close', (code, signal) => resolve(signal ?? code)));
    const enough = new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`only ${acked.size} acks within ${WAIT_MS} ms; stderr: ${stderr}`)), WAIT_MS);
      child.stdout.on('data', (chunk: Buffer) => {
        buffer += chunk.toString();
        const lines = buffer.split('\n');
        buffer = lines.pop()!;
        for (const line of lines) {
          const [word, seq, hash] = line.split(' ');
          if (word === 'ack') acked.set(Number(seq), hash!);
        }
        if (acked.size >= ACKS_BEFORE_KILL) {
          clearTimeout(timer);
          resolve();
        }
      });
      void exited.then((how) => reject(new Error(`writer stopped on its own (${how}); stderr: ${stderr}`)));
    });
    try {
      await enough;
      child.kill('SIGKILL');
    } finally {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    }
    // Acks still in the pipe when the kill landed were acknowledged too, and are read by now.
    expect(await exited).toBe('SIGKILL');

    const sequelize = await openCountDatabase(file);
    try {
      const log = new EventLog({ sequelize });
      const stored = new Map((await log.read(countId)).map((e) => [e.seq, e.hash]));
      expect(acked.size).toBeGreaterThanOrEqual(ACKS_BEFORE_KILL);
      const lost = [...acked].filter(([seq, hash]) => stored.get(seq) !== hash);
      expect(lost).toEqual([]);
      expect(await log.verify(countId)).toEqual({ ok: true, count: stored.size });
      // The log goes on after the crash from where the database says it stopped.
      const [next] = await log.append(countId, [{ type: 'count:resumed', payload: {}, actor: null, station: null }]);
      expect(next!.seq).toBe(stored.size + 1);
    } finally {
      await sequelize.close();
    }
  });
});
