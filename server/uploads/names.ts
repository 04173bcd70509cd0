import { randomBytes } from 'node:crypto';

const MAX_NAME = 150;
// Controls, and bidirectional overrides that can disguise an extension ("photo\u202Egnp.exe").
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g;

/**
 * The uploaded name made safe to show and to offer as a download name: last path segment only, no control
 * or reserved characters, at most 150 characters, ending in an extension of the type the bytes really are.
 * It is only ever stored as text; it never becomes a path.
 */
export function cleanFileName(raw: string | undefined, extensions: readonly string[]): string {
  let name = (raw ?? '').normalize('NFC');
  name = name.split(/[\\/]/).pop() ?? '';
  name = name.replace(INVISIBLE, '').replace(/[<>:"|?*]/g, '_').replace(/\s+/g, ' ');
  name = name.replace(/^[\s.]+/, '').replace(/[\s.]+$/, '');
  const dot = name.lastIndexOf('.');
  const ext = dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
  let base = dot > 0 && extensions.includes(ext) ? name.slice(0, dot) : name;
  const finalExt = extensions.includes(ext) ? name.slice(dot + 1) : extensions[0]!;
  base = base.replace(/[\s.]+$/, '') || 'file';
  const room = MAX_NAME - finalExt.length - 1;
  const chars = Array.from(base); // by code point, so no character is cut in half
  if (chars.length > room) base = chars.slice(0, room).join('').replace(/[\s.]+$/, '') || 'file';
  return `${base}.${finalExt}`;
}

/** A stored file's name: 128 random bits and the canonical extension; never anything the client sent. */
export function randomStoredName(extension: string): string {
  return `${randomBytes(16).toString('hex')}.${extension}`;
}

export const STORED_NAME = /^[0-9a-f]{32}\.[a-z0-9]{2,5}$/;
