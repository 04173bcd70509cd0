import { useId } from 'react';
import type { RiskMatrix } from '../../../domain/hazards/matrix';
import { levelClass, levelIn, levelsWorstFirst } from '../lib/risk';
import { cellKey, parseCellKey, type MatrixMode } from '../lib/filter';
import { LevelGlyph } from './LevelGlyph';

export interface HeatMapProps {
  /** The matrix drawn; counts are of hazards assessed with it. */
  matrix: RiskMatrix;
  counts: ReadonlyMap<string, number>;
  unassessed: number;
  mode: MatrixMode;
  onModeChange: (mode: MatrixMode) => void;
  selected?: string;
  onSelect: (cell: string | undefined) => void;
}

/**
 * Hazard counts per matrix cell: severity across, likelihood down (MIL-STD-882E Table III layout).
 * Each cell is a toggle button whose name says the cell, its level and its count; pressing it filters
 * the register to that cell.
 */
export function HeatMap({ matrix, counts, unassessed, mode, onModeChange, selected, onSelect }: HeatMapProps) {
  const captionId = useId();
  const MATRIX = matrix;
  const chosen = selected ? parseCellKey(selected) : null;
  const modeName = mode === 'initial' ? 'initial' : 'residual';
  return (
    <div className="min-w-0">
      <fieldset className="mb-3 flex flex-wrap items-center gap-x-4 gap-y-1">
        <legend className="mb-1 font-bold">Count hazards by</legend>
        {(['initial', 'residual'] as const).map((m) => (
          <label key={m} className="flex min-h-11 cursor-pointer items-center gap-2">
            <input type="radio" name={`${captionId}-mode`} value={m} checked={mode === m} onChange={() => onModeChange(m)} />
            <span>{m === 'initial' ? 'Initial risk (before mitigation)' : 'Residual risk (after mitigation)'}</span>
          </label>
        ))}
      </fieldset>
      <div role="region" aria-labelledby={captionId} tabIndex={0} className="overflow-x-auto">
        <table className="w-full min-w-[16rem] table-fixed border-separate border-spacing-1 text-center">
          <caption id={captionId} className="mb-1 text-left text-ink-muted">
            Number of hazards in each cell, {modeName} risk. Severity across, likelihood down. Choose a cell to filter the register.
          </caption>
          <thead>
            <tr>
              <td className="w-[5.5rem] p-1 max-sm:w-[4.9rem]" />
              {MATRIX.severities.map((s) => (
                <th key={s.key} scope="col" className="p-1 text-sm font-bold leading-tight">
                  <span className="block">{s.key}</span>
                  <span className="block font-normal max-sm:sr-only">{s.label}</span>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {MATRIX.likelihoods.map((l) => (
              <tr key={l.key}>
                <th scope="row" className="p-1 text-left text-sm font-bold leading-tight">
                  <span className="block">{l.key}</span>
                  <span className="block font-normal max-sm:text-xs max-sm:[overflow-wrap:anywhere]">{l.label}</span>
                </th>
                {MATRIX.severities.map((s) => {
                  const key = cellKey(l.key, s.key);
                  const level = levelIn(MATRIX, s.key, l.key);
                  const count = counts.get(key) ?? 0;
                  const pressed = selected === key;
                  return (
                    <td key={s.key} className="p-0">
                      <button
                        type="button"
                        aria-pressed={pressed}
                        aria-label={`${l.label} (${l.key}) by ${s.label} (${s.key}): ${level?.label ?? 'unrated'}, ${count} ${count === 1 ? 'hazard' : 'hazards'}`}
                        onClick={() => onSelect(pressed ? undefined : key)}
                        className={`flex min-h-14 w-full min-w-0 cursor-pointer flex-col items-center justify-center rounded-sm px-1 py-1 leading-tight ${level ? levelClass(level) : 'border-2 border-line-soft'}`}
                      >
                        <span className="flex items-center gap-1 text-xl font-bold">
                          <LevelGlyph glyph={level?.glyph} className="size-3.5" />
                          <span>{count}</span>
                        </span>
                        <span aria-hidden="true" className="max-w-full truncate text-xs font-bold max-sm:hidden">{pressed ? 'Filtering' : level?.label}</span>
                      </button>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-sm sm:hidden">
        Severity: {MATRIX.severities.map((s) => `${s.key} ${s.label}`).join(' · ')}
      </p>
      <ul className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-sm" aria-label="Risk levels">
        {levelsWorstFirst(MATRIX).map((level) => (
          <li key={level.key} className="inline-flex items-center gap-1.5">
            <span className={`inline-flex size-5 items-center justify-center rounded-sm ${levelClass(level)}`}>
              <LevelGlyph glyph={level.glyph} className="size-3" />
            </span>
            {level.label}
          </li>
        ))}
      </ul>
      {chosen ? (
        <p className="mt-2 font-bold">
          Filtering by {MATRIX.likelihoods.find((l) => l.key === chosen.likelihood)?.label ?? chosen.likelihood} ×{' '}
          {MATRIX.severities.find((s) => s.key === chosen.severity)?.label ?? chosen.severity}. Press the cell again to clear.
        </p>
      ) : null}
      {mode === 'residual' && unassessed > 0 ? (
        <p className="mt-2 text-ink-muted">
          {unassessed} {unassessed === 1 ? 'hazard has' : 'hazards have'} no residual assessment yet and {unassessed === 1 ? 'is' : 'are'} not counted here.
        </p>
      ) : null}
    </div>
  );
}
