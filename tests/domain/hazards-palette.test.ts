import { describe, expect, it } from 'vitest';
import { checkAcceptanceMap } from '../../src/domain/hazards/acceptance';
import { LEVEL_GLYPHS, MIL_STD_882E, THEME_SURFACES, type RiskLevel, type RiskMatrix } from '../../src/domain/hazards/matrix';
import { checkLevelPalette, LEVEL_PALETTE, swatchFor, withPaletteDefaults } from '../../src/domain/hazards/palette';
import { contrastRatio } from '../../src/domain/hazards/contrast';

describe('the level palette', () => {
  it('has eight swatches with distinct names, colours, night colours and glyphs', () => {
    expect(LEVEL_PALETTE).toHaveLength(LEVEL_GLYPHS.length);
    for (const field of ['key', 'name', 'colour', 'nightColour', 'glyph'] as const) {
      expect(new Set(LEVEL_PALETTE.map((s) => s[field])).size, field).toBe(LEVEL_PALETTE.length);
    }
  });

  it('holds the built-in MIL-STD-882E colours, so built-in levels draw with the same swatches', () => {
    for (const level of MIL_STD_882E.levels) {
      expect(swatchFor(level.colour)).toMatchObject({ colour: level.colour, nightColour: level.nightColour });
    }
  });

  // WCAG 2.1 SC 1.4.3: text needs 4.5:1; SC 1.4.11: UI graphics need 3:1 against adjacent colour.
  it.each(LEVEL_PALETTE)('$name: white label on the day fill reaches 4.5:1 (WCAG 2.1 SC 1.4.3)', (s) => {
    expect(contrastRatio(s.colour, THEME_SURFACES.dayLabel)).toBeGreaterThanOrEqual(4.5);
  });
  it.each(LEVEL_PALETTE)('$name: day fill stands out from the page by 3:1 (WCAG 2.1 SC 1.4.11)', (s) => {
    expect(contrastRatio(s.colour, THEME_SURFACES.day)).toBeGreaterThanOrEqual(3);
    expect(contrastRatio(s.colour, THEME_SURFACES.dayPaper)).toBeGreaterThanOrEqual(3);
  });
  it.each(LEVEL_PALETTE)('$name: night colour reads at 4.5:1 on the night surface (WCAG 2.1 SC 1.4.3)', (s) => {
    expect(contrastRatio(s.nightColour, THEME_SURFACES.night)).toBeGreaterThanOrEqual(4.5);
  });
  it.each(LEVEL_PALETTE)('$name: night colour is red-shifted (red channel strongest, blue weakest)', (s) => {
    // Dark-adapted night vision is spared by red light (common practice, no source).
    const n = parseInt(s.nightColour.slice(1), 16);
    const [r, g, b] = [n >> 16, (n >> 8) & 0xff, n & 0xff];
    expect(r).toBeGreaterThan(g);
    expect(g).toBeGreaterThanOrEqual(b);
  });

  it('finds a swatch whatever the letter case, and nothing for other colours', () => {
    expect(swatchFor('#a3172c')?.key).toBe('crimson');
    expect(swatchFor('#123456')).toBeUndefined();
    expect(swatchFor(undefined)).toBeUndefined();
  });
});

const level = (over: Partial<RiskLevel> & { key: string }): RiskLevel => ({ label: over.key, rank: 1, colour: '#A3172C', ...over });

describe('checkLevelPalette', () => {
  it('accepts distinct palette colours and glyphs', () => {
    expect(checkLevelPalette([level({ key: 'a', glyph: 'octagon' }), level({ key: 'b', colour: '#2B6A4E', glyph: 'circle' })])).toEqual([]);
  });

  it('refuses an off-palette colour, a wrong night partner, a shared colour and a shared glyph, each at its field', () => {
    const problems = checkLevelPalette([
      level({ key: 'a', glyph: 'octagon' }),
      level({ key: 'b', colour: '#123456' }),
      level({ key: 'c', colour: '#A3172C', glyph: 'star' }),
      level({ key: 'd', colour: '#2B6A4E', nightColour: '#FF7A66', glyph: 'octagon' }),
    ]);
    expect(problems.map((p) => [p.code, p.path])).toEqual([
      ['off-palette', 'levels[1].colour'],
      ['duplicate-colour', 'levels[2].colour'],
      ['off-palette', 'levels[3].nightColour'],
      ['duplicate-glyph', 'levels[3].glyph'],
    ]);
    expect(problems[1].message).toBe("Levels 'a' and 'c' share the colour Crimson; give each level its own.");
  });
});

describe('withPaletteDefaults', () => {
  it('adds the night partner and a glyph no other level uses', () => {
    const filled = withPaletteDefaults(
      [level({ key: 'a', glyph: 'octagon' }), level({ key: 'b', colour: '#7B2D6B' }), level({ key: 'c', colour: '#56606D', glyph: 'star' })],
      LEVEL_GLYPHS,
    );
    // b's own swatch glyph (star) is taken by c, so it gets the first free one in LEVEL_GLYPHS order.
    expect(filled.map((l) => [l.nightColour, l.glyph])).toEqual([
      ['#FF7A66', 'octagon'],
      ['#D98F84', 'triangle'],
      ['#9C8579', 'star'],
    ]);
  });

  it('leaves an off-palette level alone for the check to refuse', () => {
    expect(withPaletteDefaults([level({ key: 'x', colour: '#123456' })], LEVEL_GLYPHS)[0]).toEqual(level({ key: 'x', colour: '#123456' }));
  });
});

describe('checkAcceptanceMap', () => {
  const m: RiskMatrix = {
    id: 'pad',
    name: 'Invented pad matrix',
    severities: [{ key: '1', label: 'Severe' }],
    likelihoods: [{ key: 'A', label: 'Likely' }],
    levels: [level({ key: 'stop', rank: 2 }), level({ key: 'go', rank: 1, colour: '#2B6A4E' })],
    cells: { A: { '1': 'stop' } },
  };
  it('names the level each problem is about', () => {
    expect(checkAcceptanceMap({ stop: ['safety'], go: ['safety', 'admin'], extra: ['safety'] }, m)).toEqual([
      { level: null, message: "The map names level 'extra', which the matrix does not have." },
      { level: 'stop', message: "Level 'stop' needs fewer authorities than the milder level 'go'." },
    ]);
    expect(checkAcceptanceMap({ stop: ['safety'] }, m)).toEqual([{ level: 'go', message: "Level 'go' has no acceptance authority." }]);
    // Separation of duties: the auditor reads the record (common practice, no source).
    expect(checkAcceptanceMap({ stop: ['safety', 'auditor'], go: ['safety'] }, m)).toEqual([
      { level: 'stop', message: "Level 'stop' names the auditor, who reads the record and does not accept risk." },
    ]);
  });
});
