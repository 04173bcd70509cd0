import { useMemo, useId, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { BUILT_IN_MATRIX_ID, HAZARD_PHASES, HAZARD_SYSTEMS } from '../../../contract/hazards';
import { Button, buttonClasses } from '../../../components/ui/Button';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { HAZARD_STATUSES, HAZARD_STATUS_LABELS } from '../../../domain/hazards/mitigation';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { useHazards } from '../api/listHazards';
import { useMatrixCatalogue } from '../api/listRiskMatrices';
import { downloadCsv } from '../lib/csv';
import { hazardsToCsv } from '../lib/exportCsv';
import { applyCellFilter, applyListFilters, countCells, onMatrix, parseCellKey, type MatrixMode, type RegisterFilters } from '../lib/filter';
import { canEditHazards, PHASE_LABELS, PROPELLANT_OPTIONS, SYSTEM_LABELS } from '../lib/labels';
import { BUILT_IN_VIEW, likelihoodTextIn, severityTextIn, type MatrixView } from '../lib/risk';
import { HazardsNav } from './HazardsNav';
import { HazardTable, useHazardTable } from './HazardTable';
import { HeatMap } from './HeatMap';

const FILTER_KEYS = ['q', 'status', 'system', 'phase', 'propellant', 'risk', 'cell'] as const;
type FilterKey = (typeof FILTER_KEYS)[number];

function readFilters(params: URLSearchParams): RegisterFilters {
  const f: RegisterFilters = { mode: params.get('mode') === 'residual' ? 'residual' : 'initial' };
  const matrix = params.get('matrix');
  if (matrix) f.matrix = matrix;
  for (const key of FILTER_KEYS) {
    const v = params.get(key);
    if (v) f[key] = v;
  }
  return f;
}

function SelectFilter({
  label,
  value,
  onChange,
  options,
}: {
  label: string;
  value: string | undefined;
  onChange: (v: string) => void;
  options: readonly { value: string; label: string }[];
}) {
  const id = useId();
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      <select
        id={id}
        value={value ?? ''}
        onChange={(e) => onChange(e.target.value)}
        className="min-h-12 w-full rounded-md border-2 border-line bg-surface px-2 text-ink"
      >
        <option value="">Any</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

function MatrixChoice({ value, options, onChange }: { value: string; options: { value: string; label: string }[]; onChange: (v: string) => void }) {
  const id = useId();
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        Matrix shown
      </label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} className="min-h-12 w-full rounded-md border-2 border-line bg-surface px-2 text-ink">
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

function describeCell(cell: string, mode: MatrixMode, matrix: MatrixView): string {
  const { likelihood, severity } = parseCellKey(cell);
  const where = matrix.builtIn ? '' : ` (${matrix.name})`;
  return `${mode === 'initial' ? 'Initial' : 'Residual'} ${likelihoodTextIn(matrix, likelihood)} × ${severityTextIn(matrix, severity)}${where}`;
}

/** Matrix ids the register's hazards were assessed with, the built-in one first. */
function matricesInUse(hazards: readonly { matrixId: string }[]): string[] {
  const ids = [...new Set(hazards.map((h) => h.matrixId))];
  ids.sort((a, b) => (a === BUILT_IN_MATRIX_ID ? -1 : b === BUILT_IN_MATRIX_ID ? 1 : 0));
  return ids.length ? ids : [BUILT_IN_MATRIX_ID];
}

export function HazardRegisterPage() {
  const me = useSignedInMe();
  const canEdit = canEditHazards(me.roles);
  const hazards = useHazards();
  const [params, setParams] = useSearchParams();
  const filters = readFilters(params);
  const searchId = useId();
  const filtersId = useId();
  // On a phone the five selects fold away behind one button; from md up they are always shown.
  const [filtersOpen, setFiltersOpen] = useState(false);

  const set = (key: FilterKey | 'mode' | 'matrix', value: string | undefined) => {
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (value) next.set(key, value);
        else next.delete(key);
        // A cell means a different thing in the other assessment: switching clears it.
        if (key === 'mode' || key === 'matrix') next.delete('cell');
        return next;
      },
      { replace: true },
    );
  };

  const all = useMemo(() => hazards.data ?? [], [hazards.data]);
  const inUse = useMemo(() => matricesInUse(all), [all]);
  const { catalogue } = useMatrixCatalogue(inUse.some((id) => id !== BUILT_IN_MATRIX_ID));
  const shownId = filters.matrix && inUse.includes(filters.matrix) ? filters.matrix : inUse[0];
  const shownMatrix = catalogue.get(shownId);
  const cellFilters = { ...filters, matrix: shownId };
  const listed = useMemo(() => applyListFilters(all, filters), [all, filters.q, filters.status, filters.system, filters.phase, filters.propellant, filters.risk]); // eslint-disable-line react-hooks/exhaustive-deps
  const shown = useMemo(() => applyCellFilter(listed, cellFilters), [listed, filters.cell, filters.mode, shownId]); // eslint-disable-line react-hooks/exhaustive-deps
  const onShown = useMemo(() => onMatrix(listed, shownId), [listed, shownId]);
  const { counts, unassessed } = useMemo(() => countCells(onShown, filters.mode), [onShown, filters.mode]);
  const elsewhere = listed.length - onShown.length;
  const table = useHazardTable(shown, catalogue);
  const riskOptions = useMemo(() => {
    const seen = new Map<string, { value: string; label: string; rank: number }>();
    for (const id of inUse) {
      for (const l of catalogue.get(id)?.levels ?? []) if (!seen.has(l.key)) seen.set(l.key, { value: l.key, label: l.label, rank: l.rank });
    }
    return [...seen.values()].sort((a, b) => b.rank - a.rank);
  }, [inUse, catalogue]);

  const active = FILTER_KEYS.filter((k) => filters[k]);
  const selectFilterCount = (['status', 'system', 'phase', 'propellant', 'risk'] as const).filter((k) => filters[k]).length;

  const chipText = (key: FilterKey): string => {
    const v = filters[key] ?? '';
    switch (key) {
      case 'q':
        return `Text “${v}”`;
      case 'status':
        return `Status: ${HAZARD_STATUS_LABELS[v as keyof typeof HAZARD_STATUS_LABELS] ?? v}`;
      case 'system':
        return `System: ${SYSTEM_LABELS[v as keyof typeof SYSTEM_LABELS] ?? v}`;
      case 'phase':
        return `Phase: ${PHASE_LABELS[v as keyof typeof PHASE_LABELS] ?? v}`;
      case 'propellant':
        return `Propellant: ${PROPELLANT_OPTIONS.find((o) => o.value === v)?.label ?? v}`;
      case 'risk':
        return `Current risk: ${riskOptions.find((l) => l.value === v)?.label ?? v}`;
      case 'cell':
        return `Matrix cell: ${describeCell(v, filters.mode, shownMatrix ?? BUILT_IN_VIEW)}`;
    }
  };

  const onExport = () => {
    const rows = table.getRowModel().rows.map((r) => r.original);
    downloadCsv(`hazard-register-${new Date().toISOString().slice(0, 10)}.csv`, hazardsToCsv(rows));
  };

  return (
    <Page
      title="Hazard register"
      kicker="Hazards"
      actions={
        canEdit ? (
          <Link to="/hazards/new" className={buttonClasses('primary')}>
            New hazard
          </Link>
        ) : null
      }
    >
      <HazardsNav />
      {hazards.isPending ? <Loading label="Loading hazards…" /> : null}
      {hazards.isError ? (
        <Notice tone="danger" title="Could not load the register">
          <p>{errorMessage(hazards.error)}</p>
          <Button className="mt-2" onClick={() => void hazards.refetch()}>
            Try again
          </Button>
        </Notice>
      ) : null}
      {hazards.data ? (
        <div className="flex flex-col gap-6">
          <div className="grid gap-6 xl:grid-cols-2">
            <Section title="Risk matrix">
              {inUse.length > 1 ? (
                <div className="mb-3 max-w-md">
                  <MatrixChoice
                    value={shownId}
                    options={inUse.map((id) => ({ value: id, label: catalogue.get(id)?.name ?? id }))}
                    onChange={(id) => set('matrix', id === BUILT_IN_MATRIX_ID ? undefined : id)}
                  />
                </div>
              ) : null}
              {shownMatrix ? (
                <HeatMap
                  matrix={shownMatrix}
                  counts={counts}
                  unassessed={unassessed}
                  mode={filters.mode}
                  onModeChange={(m) => set('mode', m === 'residual' ? 'residual' : undefined)}
                  selected={filters.cell}
                  onSelect={(cell) => set('cell', cell)}
                />
              ) : (
                <Loading label="Loading the matrix…" />
              )}
              {elsewhere > 0 ? (
                <p className="mt-2 text-ink-muted">
                  {elsewhere} {elsewhere === 1 ? 'hazard was' : 'hazards were'} assessed with another matrix and {elsewhere === 1 ? 'is' : 'are'} not counted here.
                  Choose the matrix above to see {elsewhere === 1 ? 'it' : 'them'}.
                </p>
              ) : null}
              <p className="mt-2">
                <Link to={`/hazards/matrices/${encodeURIComponent(shownId)}`}>About this matrix and who accepts each level</Link>
              </p>
            </Section>
            <Section title="Find hazards">
              <div className="flex flex-col gap-4">
                <div className="flex flex-col gap-1">
                  <label htmlFor={searchId} className="font-bold">
                    Search
                  </label>
                  <input
                    id={searchId}
                    type="search"
                    value={filters.q ?? ''}
                    onChange={(e) => set('q', e.target.value)}
                    placeholder="Code, title, cause, effect…"
                    className="min-h-12 w-full rounded-md border-2 border-line bg-surface px-3 text-ink placeholder:italic placeholder:text-ink-muted"
                  />
                </div>
                <Button
                  variant="secondary"
                  className="md:hidden"
                  aria-expanded={filtersOpen}
                  aria-controls={filtersId}
                  onClick={() => setFiltersOpen((o) => !o)}
                >
                  {filtersOpen ? 'Hide filters' : 'Show filters'}
                  {selectFilterCount > 0 ? ` (${selectFilterCount} set)` : ''}
                </Button>
                <div id={filtersId} className={`${filtersOpen ? 'grid' : 'hidden'} gap-3 sm:grid-cols-2 md:grid xl:grid-cols-3`}>
                  <SelectFilter label="Status" value={filters.status} onChange={(v) => set('status', v)} options={HAZARD_STATUSES.map((s) => ({ value: s, label: HAZARD_STATUS_LABELS[s] }))} />
                  <SelectFilter label="System" value={filters.system} onChange={(v) => set('system', v)} options={HAZARD_SYSTEMS.map((s) => ({ value: s, label: SYSTEM_LABELS[s] }))} />
                  <SelectFilter label="Phase" value={filters.phase} onChange={(v) => set('phase', v)} options={HAZARD_PHASES.map((p) => ({ value: p, label: PHASE_LABELS[p] }))} />
                  <SelectFilter label="Propellant" value={filters.propellant} onChange={(v) => set('propellant', v)} options={PROPELLANT_OPTIONS} />
                  <SelectFilter
                    label="Current risk"
                    value={filters.risk}
                    onChange={(v) => set('risk', v)}
                    options={riskOptions}
                  />
                </div>
                <p className="text-sm text-ink-muted">Current risk is the residual risk once assessed, otherwise the initial risk.</p>
              </div>
            </Section>
          </div>

          <div className="flex flex-col gap-3">
            <div aria-live="polite" className="flex flex-wrap items-center gap-2">
              {active.length === 0 ? (
                <p className="text-ink-muted">No filters: all {all.length} hazards are shown.</p>
              ) : (
                <>
                  <h2 className="sr-only">Active filters</h2>
                  <ul className="flex flex-wrap gap-2" aria-label="Active filters">
                    {active.map((key) => (
                      <li key={key}>
                        <button
                          type="button"
                          onClick={() => set(key, undefined)}
                          aria-label={`Remove filter ${chipText(key)}`}
                          className="inline-flex min-h-11 cursor-pointer items-center gap-2 rounded-md border-2 border-line bg-selected px-3 font-bold text-ink hover:bg-surface"
                        >
                          <span>{chipText(key)}</span>
                          <Glyph shape="cross" />
                        </button>
                      </li>
                    ))}
                  </ul>
                  <Button variant="quiet" onClick={() => setParams(filters.mode === 'residual' ? { mode: 'residual' } : {}, { replace: true })}>
                    Clear all filters
                  </Button>
                </>
              )}
            </div>
            <div className="flex flex-wrap items-center justify-between gap-3">
              <p className="font-bold" role="status">
                {shown.length} of {all.length} hazards
              </p>
              <div className="flex flex-wrap gap-2">
                <Link to="/hazards/print" className={buttonClasses('secondary')}>
                  Print all reports
                </Link>
                <Button onClick={onExport} disabled={shown.length === 0}>
                  Export CSV ({shown.length})
                </Button>
              </div>
            </div>
            <HazardTable table={table} />
          </div>
        </div>
      ) : null}
    </Page>
  );
}
