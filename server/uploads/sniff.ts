/**
 * What a file really is, from its bytes. The name and the type the browser declared are never trusted:
 * binary types come from their signatures (file-type), and text is text only when it is valid UTF-8 with
 * no NULs or other control characters and does not open like markup.
 */
import { fileTypeFromBuffer } from 'file-type';
import { UPLOAD_TYPES, type UploadMediaType } from '../../src/contract/uploads';

export interface Sniffed {
  mediaType: UploadMediaType;
  /** The canonical extension for that type, used for the stored name and to correct the shown name. */
  extension: string;
}

const BINARY = new Set<string>(['image/png', 'image/jpeg', 'image/webp', 'image/gif', 'application/pdf']);
const TEXT_EXTENSIONS: Record<string, UploadMediaType> = { txt: 'text/plain', csv: 'text/csv' };

function canonical(mediaType: UploadMediaType): Sniffed {
  const t = UPLOAD_TYPES.find((u) => u.mediaType === mediaType)!;
  return { mediaType, extension: t.extensions[0] };
}

function extensionOf(name: string): string {
  const dot = name.lastIndexOf('.');
  return dot < 0 ? '' : name.slice(dot + 1).toLowerCase();
}

/** Valid UTF-8; tab, line feed, carriage return and form feed are the only control characters allowed. */
export function isPlainText(bytes: Uint8Array): boolean {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return false;
  }
  if (/[\u0000-\u0008\u000b\u000e-\u001f\u007f]/.test(text)) return false;
  // HTML, SVG or XML saved as .txt is refused rather than stored as "text".
  if (/^\s*</.test(text.replace(/^\uFEFF/, ''))) return false;
  return true;
}

/**
 * The accepted type of these bytes, or null when they are not one of the accepted types.
 * A text type is chosen only when the name asks for text (.txt or .csv) and the bytes are plain text.
 */
export async function sniff(bytes: Uint8Array, originalName: string): Promise<Sniffed | null> {
  if (bytes.length === 0) return null;
  const detected = await fileTypeFromBuffer(bytes);
  if (detected) return BINARY.has(detected.mime) ? canonical(detected.mime as UploadMediaType) : null;
  const textType = TEXT_EXTENSIONS[extensionOf(originalName)];
  if (textType && isPlainText(bytes)) return canonical(textType);
  return null;
}
