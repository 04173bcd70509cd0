import { describe, expect, it } from 'vitest';
import {
  LIKELIHOOD_LEVELS,
  MIL_STD_882E,
  MatrixKeyError,
  SEVERITY_CATEGORIES,
  THEME_SURFACES,
  compareLevels,
  riskLevel,
  validateMatrix,
  type RiskMatrix,
} from '../../src/domain/hazards/matrix';
import { contrastRatio, relativeLuminance } from '../../src/domain/hazards/contrast';

// MIL-STD-882E Table III as transcribed in check-values section 1 (High and Serious sets F2;
// whole map agrees with MIL-STD-882D Table A-III (F) banded per Table A-IV (from memory)).
const TABLE_III: Record<string, string[]> = {
  A: ['high', 'high', 'serious', 'medium'],
  B: ['high', 'high', 'serious', 'medium'],
  C: ['high', 'serious', 'medium', 'low'],
  D: ['serious', 'medium', 'medium', 'low'],
  E: ['medium', 'medium', 'medium', 'low'],
  F: ['eliminated', 'eliminated', 'eliminated', 'eliminated'],
};

describe('MIL-STD-882E built-in matrix', () => {
  it('has id mil-std-882e and validates clean', () => {
    expect(MIL_STD_882E.id).toBe('mil-std-882e');
    expect(validateMatrix(MIL_STD_882E)).toEqual([]);
  });

  it('names severity categories per MIL-STD-882E Table I', () => {
    // MIL-STD-882E Table I (F2)
    expect(SEVERITY_CATEGORIES.map((s) => `${s.key} ${s.label}`)).toEqual([
      '1 Catastrophic',
      '2 Critical',
      '3 Marginal',
      '4 Negligible',
    ]);
  });

  it('names probability levels per MIL-STD-882E Table II', () => {
    // MIL-STD-882E Table II (F2)
    expect(LIKELIHOOD_LEVELS.map((l) => `${l.key} ${l.label}`)).toEqual([
      'A Frequent',
      'B Probable',
      'C Occasional',
      'D Remote',
      'E Improbable',
      'F Eliminated',
    ]);
  });

  const cases = Object.entries(TABLE_III).flatMap(([lik, row]) =>
    row.map((level, i) => ({ lik, sev: String(i + 1), level })),
  );
  it('covers all 24 cells', () => expect(cases).toHaveLength(24));

  // MIL-STD-882E Table III, one check per cell (check-values section 1).
  it.each(cases)('cell $lik$sev is $level (MIL-STD-882E Table III)', ({ lik, sev, level }) => {
    expect(riskLevel(MIL_STD_882E, sev, lik).key).toBe(level);
  });

  it('ranks levels high > serious > medium > low > eliminated', () => {
    expect(compareLevels(MIL_STD_882E, 'high', 'serious')).toBeGreaterThan(0);
    expect(compareLevels(MIL_STD_882E, 'serious', 'medium')).toBeGreaterThan(0);
    expect(compareLevels(MIL_STD_882E, 'medium', 'low')).toBeGreaterThan(0);
    expect(compareLevels(MIL_STD_882E, 'low', 'eliminated')).toBeGreaterThan(0);
    expect(compareLevels(MIL_STD_882E, 'low', 'high')).toBeLessThan(0);
    expect(compareLevels(MIL_STD_882E, 'medium', 'medium')).toBe(0);
  });

  it('throws a typed error for unknown keys', () => {
    expect(() => riskLevel(MIL_STD_882E, '5', 'A')).toThrow(MatrixKeyError);
    try {
      riskLevel(MIL_STD_882E, '1', 'G');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MatrixKeyError);
      expect((e as MatrixKeyError).axis).toBe('likelihood');
      expect((e as MatrixKeyError).key).toBe('G');
    }
    expect(() => compareLevels(MIL_STD_882E, 'high', 'extreme')).toThrow(MatrixKeyError);
  });
});

describe('WCAG contrast helper', () => {
  it('matches the WCAG 2.x definition at the extremes', () => {
    // WCAG 2.x contrast ratio: (1 + 0.05) / (0 + 0.05) = 21 for white on black (D)
    expect(contrastRatio('#FFFFFF', '#000000')).toBeCloseTo(21, 6);
    expect(contrastRatio('#777777', '#777777')).toBeCloseTo(1, 6);
    expect(relativeLuminance('#000000')).toBe(0);
    expect(relativeLuminance('#FFFFFF')).toBeCloseTo(1, 9);
  });
  it('puts #767676 on white just above 4.5:1', () => {
    // from memory: #767676 is the lightest grey passing WCAG AA on white, about 4.54:1
    expect(contrastRatio('#767676', '#FFFFFF')).toBeGreaterThan(4.5);
    expect(contrastRatio('#777777', '#FFFFFF')).toBeLessThan(4.5);
  });
});

describe('built-in level styling', () => {
  const levels = MIL_STD_882E.levels;

  it('gives each level a label, a distinct glyph and distinct colours', () => {
    expect(new Set(levels.map((l) => l.glyph)).size).toBe(levels.length);
    expect(new Set(levels.map((l) => l.colour.toLowerCase())).size).toBe(levels.length);
    expect(new Set(levels.map((l) => l.nightColour?.toLowerCase())).size).toBe(levels.length);
    for (const l of levels) expect(l.label.trim()).not.toBe('');
  });

  // WCAG 2.1 SC 1.4.3: text needs 4.5:1; SC 1.4.11: UI graphics need 3:1 against adjacent colour.
  it.each(levels)('$key: white label on the day fill reaches 4.5:1 (WCAG 2.1 SC 1.4.3)', (l) => {
    expect(contrastRatio(l.colour, THEME_SURFACES.dayLabel)).toBeGreaterThanOrEqual(4.5);
  });
  it.each(levels)('$key: day fill stands out from the page by 3:1 (WCAG 2.1 SC 1.4.11)', (l) => {
    expect(contrastRatio(l.colour, THEME_SURFACES.day)).toBeGreaterThanOrEqual(3);
    expect(contrastRatio(l.colour, THEME_SURFACES.dayPaper)).toBeGreaterThanOrEqual(3);
  });
  it.each(levels)('$key: night colour reads at 4.5:1 on the night surface (WCAG 2.1 SC 1.4.3)', (l) => {
    expect(contrastRatio(l.nightColour as string, THEME_SURFACES.night)).toBeGreaterThanOrEqual(4.5);
  });
  it.each(levels)('$key: night colour is red-shifted (red channel strongest, blue weakest)', (l) => {
    // Dark-adapted night vision is spared by red light (common practice, no source).
    const n = parseInt((l.nightColour as string).slice(1), 16);
    const [r, g, b] = [n >> 16, (n >> 8) & 0xff, n & 0xff];
    expect(r).toBeGreaterThan(g);
    expect(g).toBeGreaterThanOrEqual(b);
  });
});

// An invented 3x3 team matrix (check-values section 2: test the configurable path with an invented matrix).
function ternValleyMatrix(): RiskMatrix {
  return {
    id: 'tern-valley-3x3',
    name: 'Tern Valley Rocketry Collective 3x3',
    severities: [
      { key: 'minor', label: 'Minor' },
      { key: 'major', label: 'Major' },
      { key: 'severe', label: 'Severe' },
    ],
    likelihoods: [
      { key: 'likely', label: 'Likely' },
      { key: 'possible', label: 'Possible' },
      { key: 'rare', label: 'Rare' },
    ],
    levels: [
      { key: 'red', label: 'Stop', rank: 3, colour: '#990000', glyph: 'octagon' },
      { key: 'amber', label: 'Review', rank: 2, colour: '#8a5a00', glyph: 'triangle' },
      { key: 'green', label: 'Proceed', rank: 1, colour: '#1f5f3a', glyph: 'circle' },
    ],
    cells: {
      likely: { minor: 'amber', major: 'red', severe: 'red' },
      possible: { minor: 'green', major: 'amber', severe: 'red' },
      rare: { minor: 'green', major: 'green', severe: 'amber' },
    },
  };
}

describe('team-defined matrix', () => {
  it('validates and looks up cells', () => {
    const m = ternValleyMatrix();
    expect(validateMatrix(m)).toEqual([]);
    expect(riskLevel(m, 'severe', 'possible').key).toBe('red');
    expect(riskLevel(m, 'minor', 'rare').label).toBe('Proceed');
    expect(compareLevels(m, 'amber', 'green')).toBeGreaterThan(0);
  });

  const codes = (m: RiskMatrix) => validateMatrix(m).map((p) => p.code);

  it('reports a missing cell with its path', () => {
    const m = ternValleyMatrix();
    delete m.cells.possible.major;
    const problems = validateMatrix(m);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ code: 'missing-cell', path: 'cells.possible.major' });
    expect(() => riskLevel(m, 'major', 'possible')).toThrow(MatrixKeyError);
  });

  it('reports a missing row', () => {
    const m = ternValleyMatrix();
    delete m.cells.rare;
    expect(codes(m)).toEqual(['missing-row']);
  });

  it('reports a cell naming an unknown level', () => {
    const m = ternValleyMatrix();
    m.cells.likely.minor = 'purple';
    expect(codes(m)).toEqual(['unknown-level']);
  });

  it('reports cells for keys not on the axes', () => {
    const m = ternValleyMatrix();
    m.cells.likely.catastrophic = 'red';
    m.cells.certain = { minor: 'red', major: 'red', severe: 'red' };
    expect(codes(m).sort()).toEqual(['unknown-column', 'unknown-row']);
  });

  it('reports duplicate keys on any axis', () => {
    const m = ternValleyMatrix();
    m.severities.push({ key: 'minor', label: 'Minor again' });
    m.levels.push({ key: 'green', label: 'Go', rank: 0, colour: '#123456' });
    expect(codes(m).filter((c) => c === 'duplicate-key')).toHaveLength(2);
  });

  it('reports empty axes', () => {
    const m = ternValleyMatrix();
    m.severities = [];
    m.likelihoods = [];
    m.cells = {};
    expect(codes(m)).toEqual(['empty-axis', 'empty-axis']);
  });

  it.each(['red', '#12345', '#GGGGGG', '#1234567', '123456', ''])('rejects colour %j', (colour) => {
    const m = ternValleyMatrix();
    m.levels[0].colour = colour;
    expect(validateMatrix(m)).toEqual([expect.objectContaining({ code: 'bad-colour', path: 'levels[0].colour' })]);
  });

  it('rejects a bad night colour and an unknown glyph', () => {
    const m = ternValleyMatrix();
    m.levels[1].nightColour = 'dim red';
    (m.levels[2] as { glyph?: string }).glyph = 'skull';
    expect(codes(m).sort()).toEqual(['bad-colour', 'bad-glyph']);
  });

  it('rejects shared or fractional ranks, since levels must be ordered', () => {
    const m = ternValleyMatrix();
    m.levels[1].rank = 3;
    expect(codes(m)).toEqual(['duplicate-rank']);
    m.levels[1].rank = 2.5;
    expect(codes(m)).toEqual(['bad-rank']);
  });

  it('rejects empty id, name, keys and labels', () => {
    const m = ternValleyMatrix();
    m.id = ' ';
    m.name = '';
    m.likelihoods[0].label = '';
    expect(codes(m).sort()).toEqual(['empty-id', 'empty-label', 'empty-name']);
  });
});
