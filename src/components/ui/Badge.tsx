import type { ReactNode } from 'react';
import { Glyph, type GlyphShape } from './Glyph';

export type BadgeTone = 'go' | 'caution' | 'danger' | 'neutral';

const toneClasses: Record<BadgeTone, string> = {
  go: 'border-go text-go bg-go-wash',
  caution: 'border-caution text-caution bg-caution-wash',
  danger: 'border-danger text-danger bg-danger-wash',
  neutral: 'border-line text-ink bg-surface',
};

const defaultGlyph: Record<BadgeTone, GlyphShape> = {
  go: 'circle',
  caution: 'triangle',
  danger: 'diamond',
  neutral: 'square',
};

/** A state shown as a word plus a shape, never as colour alone. */
export function Badge({ tone = 'neutral', glyph, children }: { tone?: BadgeTone; glyph?: GlyphShape; children: ReactNode }) {
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-sm border-2 px-2 py-0.5 text-sm font-bold leading-tight ${toneClasses[tone]}`}
    >
      <Glyph shape={glyph ?? defaultGlyph[tone]} />
      <span>{children}</span>
    </span>
  );
}
