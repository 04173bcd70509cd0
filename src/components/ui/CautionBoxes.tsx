import { Glyph, type GlyphShape } from './Glyph';

/** The three caution levels, most serious first (the same list as the procedure domain's CAUTION_LEVELS). */
export type CautionBoxLevel = 'warning' | 'caution' | 'note';
const LEVELS: readonly CautionBoxLevel[] = ['warning', 'caution', 'note'];

/**
 * Each level has its own word, glyph and frame, so the three read apart without colour: warnings (harm to
 * people) sit in the heaviest box with a solid bar and a capital WARNING; cautions (harm to equipment) in a
 * dashed frame; notes in a thin plain one. Warnings come first, then cautions, then notes.
 */
export const CAUTION_LOOK: Record<CautionBoxLevel, { word: string; plural: string; meaning: string; glyph: GlyphShape; box: string; head: string }> = {
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

export interface CautionBoxItem {
  level: CautionBoxLevel;
  text: string;
  /** Where it comes from, in words ('HZ-003; LOX'), or null. */
  from: string | null;
}

/** One level's cautions in one box, each item with where it comes from. */
function LevelBox({ level, items, compact }: { level: CautionBoxLevel; items: readonly CautionBoxItem[]; compact: boolean }) {
  const look = CAUTION_LOOK[level];
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
            {c.from ? <span className="block text-sm text-ink-muted">From: {c.from}</span> : null}
          </li>
        ))}
      </ul>
    </li>
  );
}

/** Cautions grouped by level in the order above; a quiet line when there are none. */
export function CautionBoxes({ items, label, compact = false, empty = 'No cautions for this step.' }: { items: readonly CautionBoxItem[]; label: string; compact?: boolean; empty?: string }) {
  if (items.length === 0) return <p className="text-sm text-ink-muted">{empty}</p>;
  return (
    <ul aria-label={label} className="flex flex-col gap-2">
      {LEVELS.map((level) => {
        const of = items.filter((c) => c.level === level);
        return of.length ? <LevelBox key={level} level={level} items={of} compact={compact} /> : null;
      })}
    </ul>
  );
}
