import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { safeNextPath } from '../../src/features/auth/components/nextPath';

/**
 * The client's own share of injection and redirect safety: where user text could become markup, a script, a
 * link target or a place to go after signing in. The server never redirects (no res.redirect in server/), so the
 * sign-in page's `next` is the only "go there afterwards" parameter.
 */

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(p);
    return /\.(ts|tsx)$/.test(e.name) ? [p] : [];
  });
}
const files = sourceFiles('src').map((f) => ({ file: f, text: readFileSync(f, 'utf8') }));
const serverFiles = sourceFiles('server').map((f) => ({ file: f, text: readFileSync(f, 'utf8') }));

describe('markup and script sinks in src/', () => {
  it('nothing writes HTML from a string or evaluates text', () => {
    const sinks = /dangerouslySetInnerHTML|\.innerHTML\b|\.outerHTML\b|insertAdjacentHTML|document\.write|\beval\(|new Function\(|srcDoc=/;
    const found = files.filter((f) => sinks.test(f.text)).map((f) => f.file);
    expect(found).toEqual([]);
  });

  /**
   * Every link or image target in the client, reviewed: each takes a server-made upload URL, a fixed path or an
   * http(s) link matched by a pattern. A new `href={…}` or `src={…}` fails here until it is added after checking
   * that user text cannot put a `javascript:` or other scheme into it.
   */
  const REVIEWED = new Map<string, string>([
    ['file.url', 'server-made /api/uploads/:id'],
    ['a.file.url', 'server-made /api/uploads/:id'],
    ['dataset.file.url', 'server-made /api/uploads/:id'],
    ['part', 'mail outbox: only parts matched by /(https?:\\/\\/[^\\s<>"]+)/'],
    ['revisionExportUrl(p.id, r.number)', 'fixed /api path with numbers'],
    ['`/api/counts/${countId}/export?format=jsonl`', 'fixed /api path with a number'],
    ['`/api/counts/${countId}/export?format=csv`', 'fixed /api path with a number'],
    ['`#phase-${ph.key}`', 'in-page anchor'],
  ]);

  it('every href={…} and src={…} in src/ is a reviewed expression', () => {
    const seen: string[] = [];
    for (const f of files) {
      for (const m of f.text.matchAll(/\b(?:href|src|action|formAction)=\{/g)) {
        // The expression up to the brace that closes this one.
        let depth = 1;
        let i = m.index + m[0].length;
        const start = i;
        for (; i < f.text.length && depth > 0; i++) depth += f.text[i] === '{' ? 1 : f.text[i] === '}' ? -1 : 0;
        const expr = f.text.slice(start, i - 1).trim();
        seen.push(expr);
        expect(REVIEWED.has(expr), `${f.file}: ${m[0]}${expr}} is not reviewed`).toBe(true);
      }
    }
    expect(seen.length).toBeGreaterThan(0);
  });

  it('the mail outbox links only http and https addresses', () => {
    const outbox = files.find((f) => f.file.endsWith('MailOutboxPage.tsx'))!;
    expect(outbox.text).toContain('const URL_PATTERN = /(https?:\\/\\/[^\\s<>"]+)/g;');
  });

  it('the server sends no redirects', () => {
    expect(serverFiles.filter((f) => /\.redirect\(|setHeader\(['"]Location/.test(f.text)).map((f) => f.file)).toEqual([]);
  });
});

describe('sign-in `next` (open redirect)', () => {
  const ORIGIN = 'https://holdfire.example';
  /** Where a browser would go from our origin: it drops tabs and newlines and reads "\" as "/" before resolving. */
  const browserTarget = (to: string) => new URL(to, ORIGIN);

  it.each([
    ['//evil.test', '/'],
    ['https://evil.test/x', '/'],
    ['/\\evil.test', '/'],
    ['/\t/evil.test', '/'],
    ['/\n/evil.test', '/'],
    ['/\r\n/evil.test', '/'],
    ['\t//evil.test', '/'],
    ['/%09/evil.test', '/%09/evil.test'],
    ['javascript:alert(1)', '/'],
    ['/sign-in?next=//evil.test', '/'],
    ['/x/../sign-in', '/'],
    ['/setup', '/'],
    ['', '/'],
    [null, '/'],
    ['/hazards/3?tab=history#mitigations', '/hazards/3?tab=history#mitigations'],
    ['/counts/2/live', '/counts/2/live'],
  ])('%j -> %j', (raw, expected) => {
    expect(safeNextPath(raw)).toBe(expected);
  });

  it('whatever the parameter holds, the browser stays on our origin', () => {
    const hostile = fc.oneof(
      fc.string(),
      fc.string({ unit: 'binary' }),
      fc.tuple(fc.constantFrom('/', '//', '/\\', '\\', '/\t', '/\n', 'http:', 'https:', 'javascript:', '/%2f', ' /', '\u3002'), fc.string()).map(([a, b]) => a + b),
      fc.webUrl().map((u) => u.replace(/^https?:/, '')),
    );
    fc.assert(
      fc.property(hostile, (raw) => {
        const to = safeNextPath(raw);
        expect(to.startsWith('/')).toBe(true);
        expect(browserTarget(to).origin).toBe(ORIGIN);
      }),
      { numRuns: 2000 },
    );
  });
});
