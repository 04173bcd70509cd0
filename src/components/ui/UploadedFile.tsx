import type { ReactNode } from 'react';
import { formatBytes, isImageType, uploadTypeOf, type UploadDto } from '../../contract/uploads';
import { Glyph } from './Glyph';

/**
 * A stored file shown by any feature: an image as a thumbnail linking to the file, anything else as a file
 * line; then its title, name, type and size, and Open (images, PDF) and Download links. `children` go under
 * the details (who added it, a note). The thumbnail is dimmed at night (.hf-evidence-image, styles.css).
 */
export function UploadedFile({ file, title, imageWord = 'Image', children }: { file: UploadDto; title: string; imageWord?: string; children?: ReactNode }) {
  const type = uploadTypeOf(file.mediaType)?.label ?? file.mediaType;
  const image = isImageType(file.mediaType);
  const opensInBrowser = image || file.mediaType === 'application/pdf';
  return (
    <div className="flex min-w-0 flex-col gap-2 sm:flex-row sm:items-start">
      {image ? (
        <a href={file.url} target="_blank" rel="noopener" className="shrink-0 self-start">
          <img
            src={file.url}
            alt={`${imageWord}: ${title}`}
            loading="lazy"
            className="hf-evidence-image block h-auto max-h-40 w-auto max-w-full rounded-md border-2 border-line-soft bg-sunken object-contain sm:max-w-56"
          />
        </a>
      ) : (
        <Glyph shape="square" className="mt-1 size-5 shrink-0 text-ink-muted" />
      )}
      <div className="min-w-0">
        <p className="font-bold [overflow-wrap:anywhere]">{title}</p>
        <p className="text-sm [overflow-wrap:anywhere]">
          <span>{file.name}</span> · {type}, {formatBytes(file.sizeBytes)}
        </p>
        {children}
        <p className="hf-no-print mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {opensInBrowser ? (
            <a href={file.url} target="_blank" rel="noopener">
              Open <span className="sr-only">{file.name} in a new tab</span>
            </a>
          ) : null}
          <a href={file.url} download={file.name}>
            Download <span className="sr-only">{file.name}</span>
          </a>
        </p>
      </div>
    </div>
  );
}
