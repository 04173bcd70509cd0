import { CAUTION_LOOK as LOOK, CautionBoxes } from '../../../components/ui/CautionBoxes';
import { Glyph } from '../../../components/ui/Glyph';
import { CAUTION_LEVELS, type CautionLevel, type ResolvedCaution } from '../../../domain/procedures/cautions';
import { sourceText } from '../lib/format';

/** A step's resolved cautions, already in print order from the server, grouped by level. */
export function CautionList({ cautions, label, compact = false }: { cautions: readonly ResolvedCaution[]; label: string; compact?: boolean }) {
  const items = cautions.map((c) => ({ level: c.level, text: c.text, from: c.sources.length ? c.sources.map(sourceText).join('; ') : null }));
  return <CautionBoxes items={items} label={label} compact={compact} />;
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
