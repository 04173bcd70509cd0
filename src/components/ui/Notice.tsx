import type { ReactNode } from 'react';
import { Glyph, type GlyphShape } from './Glyph';

export type NoticeTone = 'info' | 'success' | 'warning' | 'danger';

const tones: Record<NoticeTone, { classes: string; glyph: GlyphShape; word: string }> = {
  info: { classes: 'border-line bg-surface text-ink', glyph: 'info', word: 'Note' },
  success: { classes: 'border-go bg-go-wash text-go', glyph: 'check', word: 'Done' },
  warning: { classes: 'border-caution bg-caution-wash text-caution', glyph: 'triangle', word: 'Caution' },
  danger: { classes: 'border-danger bg-danger-wash text-danger', glyph: 'diamond', word: 'Problem' },
};

/**
 * A boxed message with a glyph and a leading word. Problems are announced as alerts and successes as
 * status; plain notes are not announced (they are part of the page).
 */
export function Notice({
  tone = 'info',
  title,
  children,
  className = '',
  announce = tone === 'danger' ? 'alert' : tone === 'success' ? 'status' : undefined,
}: {
  tone?: NoticeTone;
  title?: string;
  children?: ReactNode;
  className?: string;
  announce?: 'alert' | 'status';
}) {
  const t = tones[tone];
  return (
    <div role={announce} className={`flex gap-3 rounded-md border-2 border-l-8 p-3 ${t.classes} ${className}`}>
      <Glyph shape={t.glyph} className="mt-1 size-5" />
      <div className="min-w-0 flex-1">
        <p className="font-bold">{title ?? t.word}</p>
        {children ? <div className="text-ink [&_a]:font-bold">{children}</div> : null}
      </div>
    </div>
  );
}
