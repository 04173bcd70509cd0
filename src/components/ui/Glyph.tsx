import type { ReactNode } from 'react';

/**
 * Shape glyphs that travel with every state word, so no state is told by colour alone
 * (and each still reads in the Night theme where every hue is red-amber).
 */
export type GlyphShape = 'circle' | 'check' | 'triangle' | 'square' | 'diamond' | 'cross' | 'info' | 'dash' | 'clock' | 'person';

const paths: Record<GlyphShape, ReactNode> = {
  circle: <circle cx="8" cy="8" r="5.5" fill="currentColor" />,
  check: (
    <>
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M4.8 8.3l2.1 2.1 4.3-4.6" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
    </>
  ),
  triangle: (
    <>
      <path d="M8 1.6L15 14H1z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
      <path d="M8 6v3.6" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      <circle cx="8" cy="11.9" r="1.1" fill="currentColor" />
    </>
  ),
  square: <rect x="2.5" y="2.5" width="11" height="11" fill="none" stroke="currentColor" strokeWidth="2.2" />,
  diamond: (
    <>
      <path d="M8 1l7 7-7 7-7-7z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
      <path d="M8 4.6v4.2" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      <circle cx="8" cy="11" r="1.1" fill="currentColor" />
    </>
  ),
  cross: (
    <>
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M5.5 5.5l5 5M10.5 5.5l-5 5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
    </>
  ),
  info: (
    <>
      <rect x="1.5" y="1.5" width="13" height="13" rx="1.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M8 7.2v4.3" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      <circle cx="8" cy="4.7" r="1.1" fill="currentColor" />
    </>
  ),
  clock: (
    <>
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M8 4.5V8l2.5 1.8" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
    </>
  ),
  person: (
    <>
      <circle cx="8" cy="5" r="3" fill="currentColor" />
      <path d="M2.5 15c0-3.3 2.5-5.5 5.5-5.5s5.5 2.2 5.5 5.5z" fill="currentColor" />
    </>
  ),
  dash: <path d="M3 8h10" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />,
};

export function Glyph({ shape, className = 'size-[1.05em]' }: { shape: GlyphShape; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className={`inline-block shrink-0 ${className}`}>
      {paths[shape]}
    </svg>
  );
}
