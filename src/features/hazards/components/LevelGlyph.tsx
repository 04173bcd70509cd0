import type { LevelGlyph as LevelGlyphName } from '../../../domain/hazards/matrix';

// Shapes named by the domain's LEVEL_GLYPHS; drawn here so each level has its own outline.
const shapes: Record<LevelGlyphName, React.ReactNode> = {
  octagon: <path d="M5.2 1.5h5.6l3.7 3.7v5.6l-3.7 3.7H5.2l-3.7-3.7V5.2z" fill="currentColor" />,
  triangle: <path d="M8 1.5l6.8 12.5H1.2z" fill="currentColor" />,
  diamond: <path d="M8 1l7 7-7 7-7-7z" fill="currentColor" />,
  circle: <circle cx="8" cy="8" r="6" fill="currentColor" />,
  dash: <rect x="2" y="6.5" width="12" height="3" rx="1" fill="currentColor" />,
  square: <rect x="2.5" y="2.5" width="11" height="11" fill="currentColor" />,
  star: <path d="M8 1l2 4.6 5 .4-3.8 3.3 1.2 4.9L8 11.6 3.6 14.2l1.2-4.9L1 6l5-.4z" fill="currentColor" />,
  hexagon: <path d="M4.5 2h7L15 8l-3.5 6h-7L1 8z" fill="currentColor" />,
};

export function LevelGlyph({ glyph, className = 'size-[1em]' }: { glyph?: LevelGlyphName; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className={`inline-block shrink-0 ${className}`}>
      {shapes[glyph ?? 'square']}
    </svg>
  );
}
