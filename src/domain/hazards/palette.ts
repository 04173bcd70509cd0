/**
 * The fixed palette a team matrix's levels are coloured from. Each swatch pairs a daylight fill (white
 * label on it) with a warm night tint, both checked for contrast in tests, so a team cannot pick a colour
 * that is unreadable on the stand. The first five are the built-in MIL-STD-882E level colours.
 */
import type { LevelGlyph, MatrixProblem, RiskLevel } from './matrix';

export interface Swatch {
  key: string;
  /** Our own name for the colour, shown beside it so the choice is not by colour alone. */
  name: string;
  colour: string;
  nightColour: string;
  /** The glyph offered with this colour; a team may choose another. */
  glyph: LevelGlyph;
}

export const LEVEL_PALETTE: readonly Swatch[] = [
  { key: 'crimson', name: 'Crimson', colour: '#A3172C', nightColour: '#FF7A66', glyph: 'octagon' },
  { key: 'rust', name: 'Rust', colour: '#A64B0C', nightColour: '#F29A52', glyph: 'triangle' },
  { key: 'ochre', name: 'Ochre', colour: '#7A5C00', nightColour: '#D9B36A', glyph: 'diamond' },
  { key: 'pine', name: 'Pine', colour: '#2B6A4E', nightColour: '#C9A48C', glyph: 'circle' },
  { key: 'slate', name: 'Slate', colour: '#56606D', nightColour: '#9C8579', glyph: 'dash' },
  { key: 'plum', name: 'Plum', colour: '#7B2D6B', nightColour: '#D98F84', glyph: 'star' },
  { key: 'indigo', name: 'Indigo', colour: '#3D4A8F', nightColour: '#E0B48A', glyph: 'hexagon' },
  { key: 'umber', name: 'Umber', colour: '#6E4A2E', nightColour: '#C8946C', glyph: 'square' },
];

/** The swatch whose daylight colour this is (case-insensitive), or undefined. */
export function swatchFor(colour: string | undefined): Swatch | undefined {
  if (!colour) return undefined;
  const c = colour.toUpperCase();
  return LEVEL_PALETTE.find((s) => s.colour === c);
}

/**
 * Team matrices only: every level uses a palette colour (and its own night partner), and no two levels
 * share a colour or a glyph, so each level stays distinct by colour, shape and word.
 */
export function checkLevelPalette(levels: readonly RiskLevel[]): MatrixProblem[] {
  const problems: MatrixProblem[] = [];
  const colours = new Map<string, string>();
  const glyphs = new Map<string, string>();
  const names = LEVEL_PALETTE.map((s) => s.name).join(', ');
  levels.forEach((l, i) => {
    const at = `levels[${i}]`;
    const swatch = swatchFor(l.colour);
    if (!swatch) {
      problems.push({ code: 'off-palette', path: `${at}.colour`, message: `Level '${l.label || l.key}' needs a colour from the palette (${names}).` });
    } else {
      if (l.nightColour !== undefined && l.nightColour.toUpperCase() !== swatch.nightColour) {
        problems.push({ code: 'off-palette', path: `${at}.nightColour`, message: `Level '${l.label || l.key}' night colour must be ${swatch.nightColour}, the partner of ${swatch.name}.` });
      }
      const other = colours.get(swatch.key);
      if (other !== undefined) problems.push({ code: 'duplicate-colour', path: `${at}.colour`, message: `Levels '${other}' and '${l.label || l.key}' share the colour ${swatch.name}; give each level its own.` });
      else colours.set(swatch.key, l.label || l.key);
    }
    if (l.glyph !== undefined) {
      const other = glyphs.get(l.glyph);
      if (other !== undefined) problems.push({ code: 'duplicate-glyph', path: `${at}.glyph`, message: `Levels '${other}' and '${l.label || l.key}' share the shape ${l.glyph}; give each level its own.` });
      else glyphs.set(l.glyph, l.label || l.key);
    }
  });
  return problems;
}

/**
 * Fills what a team may leave out: the night partner of the chosen colour, and a glyph (the swatch's own,
 * or the first one no other level uses). Levels off the palette are left for checkLevelPalette to refuse.
 */
export function withPaletteDefaults(levels: readonly RiskLevel[], glyphs: readonly LevelGlyph[]): RiskLevel[] {
  const used = new Set(levels.map((l) => l.glyph).filter((g): g is LevelGlyph => g !== undefined));
  return levels.map((l) => {
    const swatch = swatchFor(l.colour);
    if (!swatch) return { ...l };
    let glyph = l.glyph;
    if (glyph === undefined) {
      glyph = !used.has(swatch.glyph) ? swatch.glyph : glyphs.find((g) => !used.has(g));
      if (glyph !== undefined) used.add(glyph);
    }
    return { ...l, nightColour: l.nightColour ?? swatch.nightColour, ...(glyph !== undefined ? { glyph } : {}) };
  });
}
