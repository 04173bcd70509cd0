import type { RiskLevel } from '../../../domain/hazards/matrix';
import { levelClass } from '../lib/risk';
import { LevelGlyph } from './LevelGlyph';

/** A risk level as colour + glyph + word; "Not rated" when the pair is incomplete. */
export function RiskBadge({ level, prefix }: { level: RiskLevel | null; prefix?: string }) {
  if (!level) {
    return (
      <span className="inline-flex items-center gap-1.5 rounded-sm border-2 border-line-soft px-2 py-0.5 text-sm font-bold leading-tight text-ink-muted">
        {prefix ? <span>{prefix}</span> : null}
        <span>Not rated</span>
      </span>
    );
  }
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-sm px-2 py-0.5 text-sm font-bold leading-tight ${levelClass(level)}`}>
      <LevelGlyph glyph={level.glyph} />
      {prefix ? <span>{prefix}</span> : null}
      <span>{level.label}</span>
    </span>
  );
}
