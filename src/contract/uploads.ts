/**
 * Uploaded files: the limits both sides state, the types the server accepts after reading the bytes,
 * and what the API says about a stored file.
 */

/** Largest file accepted, in bytes: 10 MB (decimal, as the screens say it). */
export const UPLOAD_MAX_BYTES = 10_000_000;
export const UPLOAD_MAX_IN_WORDS = `${UPLOAD_MAX_BYTES / 1_000_000} MB`;

/**
 * Accepted types. The server decides the type from the file's content, never from the name or the type the
 * browser declared; plain text and CSV are accepted only when the bytes are valid UTF-8 text.
 */
export const UPLOAD_TYPES = [
  { mediaType: 'image/png', label: 'PNG', extensions: ['png'], image: true },
  { mediaType: 'image/jpeg', label: 'JPEG', extensions: ['jpg', 'jpeg'], image: true },
  { mediaType: 'image/webp', label: 'WebP', extensions: ['webp'], image: true },
  { mediaType: 'image/gif', label: 'GIF', extensions: ['gif'], image: true },
  { mediaType: 'application/pdf', label: 'PDF', extensions: ['pdf'], image: false },
  { mediaType: 'text/plain', label: 'plain text', extensions: ['txt'], image: false },
  { mediaType: 'text/csv', label: 'CSV', extensions: ['csv'], image: false },
] as const;

export type UploadMediaType = (typeof UPLOAD_TYPES)[number]['mediaType'];

export function uploadTypeOf(mediaType: string) {
  return UPLOAD_TYPES.find((t) => t.mediaType === mediaType);
}

export function isImageType(mediaType: string): boolean {
  return uploadTypeOf(mediaType)?.image ?? false;
}

/** For a file input's accept attribute (a hint to the picker; the server checks the content). */
export const UPLOAD_ACCEPT = UPLOAD_TYPES.flatMap((t) => t.extensions.map((e) => `.${e}`)).join(',');

/** "PNG, JPEG, WebP, GIF, PDF, plain text or CSV" */
export const UPLOAD_TYPES_IN_WORDS = (() => {
  const labels = UPLOAD_TYPES.map((t) => t.label);
  return `${labels.slice(0, -1).join(', ')} or ${labels[labels.length - 1]}`;
})();

/** 1 234 567 bytes -> "1.2 MB"; decimal units, as file managers show them. */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(bytes < 10_000 ? 1 : 0)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** A stored file as the API describes it. */
export interface UploadDto {
  id: number;
  /** The name it was uploaded with, cleaned; never used as a path on the server. */
  name: string;
  mediaType: string;
  sizeBytes: number;
  sha256: string;
  /** GET this (signed in, same team) to read the file. */
  url: string;
  uploadedAt: string;
}
