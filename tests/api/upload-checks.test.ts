import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db';
import { createMigrator } from '../../server/db/migrator';
import { cleanFileName, sniff } from '../../server/uploads';
import { isPlainText } from '../../server/uploads/sniff';
import { makePng } from '../helpers/png';

// Minimal but genuine file signatures: JPEG SOI + JFIF APP0, GIF89a header, RIFF/WEBP VP8 header, PDF header.
const JPEG = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9]);
const GIF = Buffer.concat([Buffer.from('GIF89a'), Buffer.from([1, 0, 1, 0, 0x80, 0, 0, 0, 0, 0, 0xff, 0xff, 0xff, 0x21, 0xf9, 4, 1, 0, 0, 0, 0, 0x2c, 0, 0, 0, 0, 1, 0, 1, 0, 0, 2, 2, 0x44, 1, 0, 0x3b])]);
const WEBP = Buffer.concat([Buffer.from('RIFF'), Buffer.from([0x1a, 0, 0, 0]), Buffer.from('WEBPVP8 '), Buffer.from([0x0e, 0, 0, 0]), Buffer.alloc(14)]);
const PDF = Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n<<>>\nendobj\n%%EOF\n', 'latin1');

describe('sniff: the type comes from the bytes', () => {
  it.each([
    ['PNG', makePng(), 'x.png', 'image/png'],
    ['JPEG', JPEG, 'x.jpeg', 'image/jpeg'],
    ['GIF', GIF, 'x.gif', 'image/gif'],
    ['WebP', WEBP, 'x.webp', 'image/webp'],
    ['PDF', PDF, 'x.pdf', 'application/pdf'],
    ['PNG sent with no name at all', makePng(), '', 'image/png'],
    ['PDF sent as .txt', PDF, 'notes.txt', 'application/pdf'],
    ['UTF-8 text with a BOM and umlauts', Buffer.from('\uFEFFDruckprüfung bestanden\r\n\tSeite 2\f', 'utf8'), 'log.txt', 'text/plain'],
    ['CSV', Buffer.from('a,b\n1,2\n'), 'DATA.CSV', 'text/csv'],
  ])('%s -> %s', async (_name, bytes, name, expected) => {
    expect((await sniff(bytes, name))?.mediaType).toBe(expected);
  });

  it.each([
    ['empty', Buffer.alloc(0), 'x.txt'],
    ['text without a text extension', Buffer.from('hello'), 'hello'],
    ['text named .md', Buffer.from('# notes'), 'notes.md'],
    ['XML as .csv', Buffer.from('<?xml version="1.0"?><a/>'), 'x.csv'],
    ['a bell character', Buffer.from('ding\u0007'), 'x.txt'],
    ['truncated UTF-8', Buffer.from([0x70, 0xc3]), 'x.txt'],
    ['gzip', Buffer.from([0x1f, 0x8b, 0x08, 0, 0, 0, 0, 0, 0, 3, 0, 0]), 'x.png'],
  ])('%s -> refused', async (_name, bytes, name) => {
    expect(await sniff(bytes, name)).toBeNull();
  });

  it('isPlainText allows tab, CR, LF and form feed but no other control characters', () => {
    expect(isPlainText(Buffer.from('a\tb\r\nc\fd'))).toBe(true);
    expect(isPlainText(Buffer.from('a\u0000b'))).toBe(false);
    expect(isPlainText(Buffer.from('a\u001bb'))).toBe(false);
  });
});

describe('cleanFileName', () => {
  it.each([
    ['../../x.png', ['png'], 'x.png'],
    ['C:\\Users\\pad\\Desktop\\valve.PNG', ['png'], 'valve.PNG'],
    ['photo.jpg', ['jpg', 'jpeg'], 'photo.jpg'],
    ['photo.jpeg', ['jpg', 'jpeg'], 'photo.jpeg'],
    ['scan.pdf', ['png'], 'scan.pdf.png'],
    ['no-extension', ['pdf'], 'no-extension.pdf'],
    ['', ['png'], 'file.png'],
    ['...', ['png'], 'file.png'],
    ['.png', ['png'], 'png.png'],
    ['a<b>c:d"e|f?g*.png', ['png'], 'a_b_c_d_e_f_g_.png'],
    ['line\r\nbreak\u0000.png', ['png'], 'linebreak.png'],
    ['photo\u202Egnp.exe', ['png'], 'photognp.exe.png'],
    ['  spaced   out  .png  ', ['png'], 'spaced out.png'],
    ['Prüfung.csv', ['csv'], 'Prüfung.csv'],
  ])('%j -> %j', (raw, exts, expected) => {
    expect(cleanFileName(raw, exts)).toBe(expected);
  });

  it('keeps at most 150 characters, the extension included, without splitting a character', () => {
    const long = cleanFileName(`${'🚀'.repeat(200)}.png`, ['png']);
    expect(Array.from(long)).toHaveLength(150);
    expect(long.endsWith('🚀.png')).toBe(true);
  });
});

describe('migration 0003-uploads', () => {
  it('goes down and up again, keeping the delete rules of the evidence table', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'holdfire-migration-'));
    const sequelize = await openDatabase({ sqliteStorage: path.join(dir, 'db.sqlite') });
    try {
      const migrator = createMigrator(sequelize);
      const rules = async () =>
        (await sequelize.query("PRAGMA foreign_key_list('mitigation_evidence')", { type: QueryTypes.SELECT }))
          .map((r) => { const f = r as { from: string; table: string; on_delete: string }; return `${f.from}->${f.table} ${f.on_delete}`; })
          .sort();
      await migrator.up({ to: '0002-hazards' });
      const before = await rules();
      await migrator.up({ to: '0003-uploads' });
      expect(await rules()).toEqual([...before, 'upload_id->uploads RESTRICT'].sort());
      await migrator.down({ to: '0003-uploads' });
      expect(await rules()).toEqual(before);
      expect(before).toEqual(['created_by_id->users SET NULL', 'mitigation_id->mitigations CASCADE']);
      await migrator.up();
    } finally {
      await sequelize.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
