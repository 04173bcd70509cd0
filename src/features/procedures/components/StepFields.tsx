import { useId, useState } from 'react';
import { CheckboxGroup, FieldError, TextField } from '../../../components/ui/Field';
import { SelectField, TextAreaField } from '../../../components/ui/SelectField';
import type { StationDto } from '../../../contract/procedures';
import { PERSONNEL_CHECK_LABELS, PERSONNEL_CHECKS, STEP_KIND_LABELS, STEP_KINDS, type PersonnelCheck, type StepKind } from '../../../domain/procedures/steps';
import type { PropellantId } from '../../../domain/propellants/library';
import type { HazardOption } from '../api/listHazardOptions';
import { DURATION_HINT, type StepDraft } from '../lib/draft';
import { PROPELLANT_OPTIONS } from '../lib/format';
import { fieldProblem } from '../lib/validate';

const KIND_HINTS: Record<StepKind, string> = {
  action: 'Something a station does.',
  verification: 'Something a station checks and confirms.',
  reading: 'A measured value with its redline: a unit and at least one limit.',
  poll: 'A go/no-go call: the stations that must answer.',
  builtInHold: 'A planned hold at a count time, with its length.',
  personnelCheck: 'Keep-out area clear, head count, or both.',
};

/** The fields of one step, bound to the draft; each shows its own problem beneath it. */
export function StepFields({
  step,
  number,
  onChange,
  problems,
  stations,
  hazards,
}: {
  step: StepDraft;
  number: number;
  onChange: (patch: Partial<Omit<StepDraft, 'key'>>) => void;
  problems: ReadonlyMap<string, string>;
  stations: readonly StationDto[];
  hazards: readonly HazardOption[];
}) {
  const err = (field: string) => fieldProblem(problems, field);
  const stationOptions = stations.map((s) => ({ value: s.code, label: `${s.code} — ${s.name}` }));
  // A code the team no longer has still shows, so the problem beside it makes sense.
  if (step.station && !stations.some((s) => s.code === step.station)) stationOptions.push({ value: step.station, label: `${step.station} (not a station of your team)` });

  return (
    <fieldset className="flex min-w-0 flex-col gap-4">
      <legend className="sr-only">Step {number}</legend>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Kind"
          hint={KIND_HINTS[step.kind]}
          value={step.kind}
          onChange={(e) => onChange({ kind: e.target.value as StepKind })}
          options={STEP_KINDS.map((k) => ({ value: k, label: STEP_KIND_LABELS[k] }))}
          error={err('kind')}
        />
        <TextField
          label="Count time"
          hint="Like T-30:00, T+5:00 or T-2:00:00. Leave empty for an untimed step that follows the one before."
          value={step.time}
          autoComplete="off"
          spellCheck={false}
          onChange={(e) => onChange({ time: e.target.value })}
          error={err('tSeconds')}
          className="[&_input]:font-mono"
        />
      </div>
      <SelectField
        label="Responsible station"
        value={step.station}
        placeholder="Choose a station…"
        onChange={(e) => onChange({ station: e.target.value })}
        options={stationOptions}
        error={err('station')}
      />
      <TextAreaField label="Instruction" rows={3} value={step.instruction} onChange={(e) => onChange({ instruction: e.target.value })} error={err('instruction')} />

      {step.kind === 'reading' ? (
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Unit" hint="bar, %, ohm…" value={step.unit} onChange={(e) => onChange({ unit: e.target.value })} error={err('unit')} />
          <TextField
            label="Minimum (redline)"
            hint="Empty for none."
            inputMode="decimal"
            value={step.min}
            onChange={(e) => onChange({ min: e.target.value })}
            error={err('min')}
          />
          <TextField
            label="Maximum (redline)"
            hint="Empty for none."
            inputMode="decimal"
            value={step.max}
            onChange={(e) => onChange({ max: e.target.value })}
            error={err('max')}
          />
        </div>
      ) : null}
      {step.kind === 'poll' ? (
        <CheckboxGroup
          legend="Stations that must answer go/no-go"
          layout="wrap"
          options={stations.map((s) => ({ value: s.code, label: s.code }))}
          value={step.stations}
          onChange={(next) => onChange({ stations: next })}
          error={err('stations')}
        />
      ) : null}
      {step.kind === 'builtInHold' ? (
        <TextField
          label="Hold length"
          hint={DURATION_HINT}
          value={step.duration}
          autoComplete="off"
          onChange={(e) => onChange({ duration: e.target.value })}
          error={err('durationSeconds')}
          className="max-w-xs [&_input]:font-mono"
        />
      ) : null}
      {step.kind === 'personnelCheck' ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <CheckboxGroup
            legend="What is checked"
            options={PERSONNEL_CHECKS.map((c) => ({ value: c, label: PERSONNEL_CHECK_LABELS[c] }))}
            value={step.checks}
            onChange={(next) => onChange({ checks: next as PersonnelCheck[] })}
            error={err('checks')}
          />
          <TextField label="Zone" hint="Which area, for example: stand area inside the 30 m rope." value={step.zone} onChange={(e) => onChange({ zone: e.target.value })} error={err('zone')} />
        </div>
      ) : null}

      <HazardPicker hazards={hazards} value={step.hazardIds} onChange={(next) => onChange({ hazardIds: next })} error={err('hazardIds')} />
      <CheckboxGroup
        legend="Propellants handled (their cautions and PPE join the step)"
        layout="wrap"
        options={PROPELLANT_OPTIONS}
        value={step.propellants}
        onChange={(next) => onChange({ propellants: next as PropellantId[] })}
        error={err('propellants')}
      />
      <TextAreaField
        label="Note"
        hint="Your own note, printed with the step’s cautions."
        rows={2}
        value={step.note}
        onChange={(e) => onChange({ note: e.target.value })}
        error={err('note')}
      />
    </fieldset>
  );
}

/** Linked hazards, chosen from the register; a filter helps once the register is long. */
function HazardPicker({
  hazards,
  value,
  onChange,
  error,
}: {
  hazards: readonly HazardOption[];
  value: readonly number[];
  onChange: (next: number[]) => void;
  error?: string;
}) {
  const id = useId();
  const [filter, setFilter] = useState('');
  const q = filter.trim().toLowerCase();
  const shown = q ? hazards.filter((h) => value.includes(h.id) || `${h.code} ${h.title}`.toLowerCase().includes(q)) : hazards;
  const toggle = (hid: number, on: boolean) => {
    const next = on ? [...value, hid] : value.filter((v) => v !== hid);
    // Keep the register's order so a diff shows only real changes.
    onChange(hazards.map((h) => h.id).filter((x) => next.includes(x)).concat(next.filter((x) => !hazards.some((h) => h.id === x))));
  };
  const unknown = value.filter((v) => !hazards.some((h) => h.id === v));
  return (
    <fieldset aria-describedby={error ? `${id}-error` : undefined} className="min-w-0">
      <legend className="mb-1 font-bold">Linked hazards (their mitigations become the step’s cautions)</legend>
      {hazards.length > 8 ? (
        <div className="mb-2 flex flex-col gap-1">
          <label htmlFor={`${id}-filter`} className="text-sm font-bold">
            Find a hazard
          </label>
          <input
            id={`${id}-filter`}
            type="search"
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            placeholder="Code or words of the title"
            className="min-h-12 w-full max-w-md rounded-md border-2 border-line bg-surface px-3 text-ink placeholder:italic placeholder:text-ink-muted"
          />
        </div>
      ) : null}
      {hazards.length === 0 ? <p className="text-ink-muted">The register has no hazards yet.</p> : null}
      <div className="max-h-72 overflow-y-auto rounded-md border-2 border-line-soft p-2" role="group" aria-label="Hazards of the register">
        {shown.map((h) => (
          <label key={h.id} className="flex min-h-11 cursor-pointer items-start gap-2.5 py-1">
            <input type="checkbox" className="mt-0.5" checked={value.includes(h.id)} onChange={(e) => toggle(h.id, e.target.checked)} />
            <span className="min-w-0">
              <span className="font-bold">{h.code}</span> {h.title}
              {h.status === 'closed' ? <span className="text-sm text-ink-muted"> (closed: adds no cautions)</span> : null}
            </span>
          </label>
        ))}
        {shown.length === 0 && hazards.length > 0 ? <p className="text-ink-muted">No hazard matches “{filter}”.</p> : null}
      </div>
      {unknown.length ? <p className="mt-1 text-sm">Also linked: hazard ids {unknown.join(', ')}, not in the register.</p> : null}
      <FieldError id={`${id}-error`} message={error} />
    </fieldset>
  );
}
