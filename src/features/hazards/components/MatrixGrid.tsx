import { useId } from 'react';
import { ROLE_LABELS, type Role } from '../../../domain/people/roles';
import type { RiskMatrix } from '../../../domain/hazards/matrix';
import { levelClass, levelIn, levelsWorstFirst } from '../lib/risk';
import { LevelGlyph } from './LevelGlyph';
import { RiskBadge } from './RiskBadge';

/**
 * A matrix as a table: likelihood down, severity across (the MIL-STD-882E Table III layout, as on the
 * register's heat-map). Every cell carries its level's word and glyph as well as its colour.
 */
export function MatrixGrid({ matrix }: { matrix: RiskMatrix }) {
  const captionId = useId();
  return (
    <div role="region" aria-labelledby={captionId} tabIndex={0} className="overflow-x-auto">
      <table className="w-full min-w-[18rem] table-fixed border-separate border-spacing-1 text-center">
        <caption id={captionId} className="mb-1 text-left text-ink-muted">
          Risk level for each pair: severity across, likelihood down.
        </caption>
        <thead>
          <tr>
            <td className="w-[6rem] p-1 max-sm:w-[4.5rem]" />
            {matrix.severities.map((s) => (
              <th key={s.key} scope="col" className="p-1 align-bottom text-sm font-bold leading-tight">
                <span className="block">{s.key}</span>
                <span className="block font-normal [overflow-wrap:anywhere]">{s.label}</span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {matrix.likelihoods.map((l) => (
            <tr key={l.key}>
              <th scope="row" className="p-1 text-left text-sm font-bold leading-tight">
                <span className="block">{l.key}</span>
                <span className="block font-normal [overflow-wrap:anywhere]">{l.label}</span>
              </th>
              {matrix.severities.map((s) => {
                const level = levelIn(matrix, s.key, l.key);
                return (
                  <td
                    key={s.key}
                    className={`min-h-12 rounded-sm px-1 py-2 text-sm font-bold leading-tight ${level ? levelClass(level) : 'border-2 border-dashed border-line-soft'}`}
                  >
                    {level ? (
                      <span className="flex flex-col items-center gap-0.5">
                        <LevelGlyph glyph={level.glyph} className="size-4" />
                        <span className="max-w-full [overflow-wrap:anywhere]">{level.label}</span>
                      </span>
                    ) : (
                      <span>Not set</span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Severity categories or likelihood levels with what each means, where the team wrote it down. */
export function AxisDefinitions({ title, entries }: { title: string; entries: readonly { key: string; label: string; description?: string }[] }) {
  return (
    <div className="min-w-0">
      <h3 className="mb-2 text-lg font-bold">{title}</h3>
      <dl className="grid grid-cols-[3.5rem_minmax(0,1fr)] gap-x-3 gap-y-2">
        {entries.map((e) => (
          <div key={e.key} className="contents">
            <dt className="font-bold">{e.key}</dt>
            <dd>
              <span className="font-bold">{e.label}</span>
              {e.description ? <span className="block text-ink-muted">{e.description}</span> : null}
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

export function rolesInWords(roles: readonly Role[]): string {
  const names = roles.map((r) => ROLE_LABELS[r] ?? r);
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** Who must accept each level, worst first; two or more roles means as many different people. */
export function AcceptanceList({ matrix, acceptanceMap }: { matrix: RiskMatrix; acceptanceMap: Readonly<Record<string, readonly Role[]>> }) {
  return (
    <ul className="flex flex-col gap-2">
      {levelsWorstFirst(matrix).map((level) => {
        const roles = acceptanceMap[level.key] ?? [];
        return (
          <li key={level.key} className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border-2 border-line-soft p-2">
            <RiskBadge level={level} />
            <span>
              {roles.length === 0 ? (
                <span className="font-bold text-danger">No one is set to accept this level.</span>
              ) : (
                <>
                  Accepted by the {rolesInWords(roles)}
                  {roles.length > 1 ? <span className="text-ink-muted"> ({roles.length} different people)</span> : null}
                </>
              )}
            </span>
          </li>
        );
      })}
    </ul>
  );
}
