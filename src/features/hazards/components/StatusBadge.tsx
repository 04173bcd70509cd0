import { Badge, type BadgeTone } from '../../../components/ui/Badge';
import type { GlyphShape } from '../../../components/ui/Glyph';
import { statusLabel } from '../lib/filter';

const look: Record<string, { tone: BadgeTone; glyph: GlyphShape }> = {
  open: { tone: 'danger', glyph: 'diamond' },
  mitigating: { tone: 'caution', glyph: 'triangle' },
  'awaiting-acceptance': { tone: 'caution', glyph: 'clock' },
  accepted: { tone: 'go', glyph: 'check' },
  closed: { tone: 'neutral', glyph: 'square' },
};

export function StatusBadge({ status }: { status: string }) {
  const l = look[status] ?? { tone: 'neutral' as const, glyph: 'square' as const };
  return (
    <Badge tone={l.tone} glyph={l.glyph}>
      {statusLabel(status)}
    </Badge>
  );
}
