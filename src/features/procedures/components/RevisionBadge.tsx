import { Badge } from '../../../components/ui/Badge';
import type { RevisionStatus } from '../../../domain/procedures/release';

/** Draft or released, as a word and a shape. */
export function RevisionBadge({ status, number }: { status: RevisionStatus; number?: number }) {
  const prefix = number === undefined ? '' : `Revision ${number}: `;
  return status === 'released' ? (
    <Badge tone="go" glyph="check">
      {prefix}Released
    </Badge>
  ) : (
    <Badge tone="caution" glyph="clock">
      {prefix}Draft
    </Badge>
  );
}
