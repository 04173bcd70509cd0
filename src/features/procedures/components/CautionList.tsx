import { Glyph, type GlyphShape } from '../../../components/ui/Glyph';
import { CAUTION_LEVELS, type CautionLevel, type ResolvedCaution } from '../../../domain/procedures/cautions';
import { sourceText } from '../lib/format';

/**
 * Each level has its own word, glyph and frame, so the three read apart without colour: warnings (harm to
 * people) sit in the heaviest box with a solid bar and a capital WARNING; cautions (harm to equipment) in a
 * dashed frame; notes in a thin plain one. Warnings come first, then cautions, then notes.
 */
const LOOK: Record<CautionLevel, { word: string; plural: string; meaning: string; glyph: GlyphShape; box: string; head: string }> = {
  warning: {
    word: 'WARNING',
    plural: 'WARNINGS',
    meaning: 'harm to people',
    glyph: 'diamond',
    box: 'border-[3px] border-l-[10px] border-danger bg-danger-wash',
    head: 'text-danger',
  },
  caution: {
    word: 'CAUTION',
    plural: 'CAUTIONS',
    meaning: 'harm to equipment',
    glyph: 'triangle',
    box: 'border-2 border-dashed border-l-[6px] [border-left-style:solid] border-caution bg-caution-wash',
    head: 'text-caution',
  },
  note: {
    word: 'NOTE',
    plural: 'NOTES',
    meaning: 'for information',
    glyph: 'info',
    box: 'border-2 border-line-soft bg-surface',
    head: 'text-ink',
  },
};

/** One level's cautions in one box, each item with where it comes from. */
function LevelBox({ level, items, compact }: { level: CautionLevel; items: readonly ResolvedCaution[]; compact: boolean }) {
  const look = LOOK[level];
  return (
    <li className={`hf-caution hf-caution-${level} rounded-sm p-2 ${look.box}`}>
      <p className={`flex flex-wrap items-center gap-x-1.5 font-bold tracking-wide ${look.head}`}>
        <Glyph shape={look.glyph} className={level === 'warning' ? 'size-5' : 'size-4'} />
        <span>{items.length > 1 ? look.plural : look.word}</span>
        <span className="text-sm font-normal tracking-normal text-ink-muted">({look.meaning})</span>
      </p>
      <ul className={`flex flex-col gap-1.5 ${items.length > 1 ? 'mt-1 list-disc pl-5' : ''}`}>
        {items.map((c, i) => (
          <li key={i} className={compact ? 'text-sm' : ''}>
            <span className="text-ink">{c.text}</span>
            {c.sources.length ? <span className="block text-sm text-ink-muted">From: {c.sources.map(sourceText).join('; ')}</span> : null}
          </li>
        ))}
      </ul>
    </li>
  );
}

/** A step's resolved cautions, already in print order from the server, grouped by level. */
export function CautionList({ cautions, label, compact = false }: { cautions: readonly ResolvedCaution[]; label: string; compact?: boolean }) {
  if (cautions.length === 0) return <p className="text-sm text-ink-muted">No cautions for this step.</p>;
  return (
    <ul aria-label={label} className="flex flex-col gap-2">
      {CAUTION_LEVELS.map((level) => {
        const items = cautions.filter((c) => c.level === level);
        return items.length ? <LevelBox key={level} level={level} items={items} compact={compact} /> : null;
      })}
    </ul>
  );
}

/** '2 warnings, 1 caution' for a closed step card. */
export function cautionCounts(cautions: readonly ResolvedCaution[]): { level: CautionLevel; count: number }[] {
  return CAUTION_LEVELS.map((level) => ({ level, count: cautions.filter((c) => c.level === level).length })).filter((x) => x.count > 0);
}

export function CautionCounts({ cautions }: { cautions: readonly ResolvedCaution[] }) {
  const counts = cautionCounts(cautions);
  if (!counts.length) return <span className="text-sm text-ink-muted">No cautions</span>;
  return (
    <span className="inline-flex flex-wrap gap-x-3 gap-y-1 text-sm font-bold">
      {counts.map(({ level, count }) => (
        <span key={level} className={`inline-flex items-center gap-1 ${LOOK[level].head}`}>
          <Glyph shape={LOOK[level].glyph} />
          {count} {level}
          {count === 1 ? '' : 's'}
        </span>
      ))}
    </span>
  );
}
