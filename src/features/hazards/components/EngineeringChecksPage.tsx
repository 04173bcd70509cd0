import type { UseQueryResult } from '@tanstack/react-query';
import type { CalcName, OxygenCalcResult, PropellantMassCalcResult, QuantityDistanceCalcResult, RiskCalcResult, SurgeCalcResult } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { Notice } from '../../../components/ui/Notice';
import { Page } from '../../../components/ui/Page';
import { CAUTION_GOVERNING_CODE } from '../../../domain/calc/caution';
import { QD_COMBINATIONS, QD_SETTINGS } from '../../../domain/calc/quantityDistance';
import { MASS_PROPELLANTS } from '../../../domain/calc/propellantMass';
import { SURGE_FLUIDS } from '../../../domain/calc/surge';
import { getLevel } from '../../../domain/hazards/matrix';
import { useSignedInMe } from '../../../lib/session';
import { useOxygenCalc, type OxygenCalcInput } from '../api/calcOxygen';
import { usePropellantMassCalc, type PropellantMassCalcInput } from '../api/calcPropellantMass';
import { useQuantityDistanceCalc, type QuantityDistanceCalcInput } from '../api/calcQuantityDistance';
import { useRiskCalc, type RiskCalcInput } from '../api/calcRisk';
import { useSurgeCalc, type SurgeCalcInput } from '../api/calcSurge';
import { fmt, QD_COMBINATION_LABELS, QD_DISTANCE_LABELS, QD_SETTING_LABELS } from '../lib/calcEvidence';
import { canEditHazards, propellantName } from '../lib/labels';
import { MATRIX } from '../lib/risk';
import { CalcCard, SourcesAndCautions } from './CalcCard';
import { HazardsNav } from './HazardsNav';
import { RiskBadge } from './RiskBadge';

type In = Record<string, string | number> | null;

// The forms' inputs are checked by the server against the contract schemas; these adapters only type them.
const useRisk = (i: In) => useRiskCalc(i as RiskCalcInput | null) as UseQueryResult<RiskCalcResult>;
const useMass = (i: In) => usePropellantMassCalc(i as PropellantMassCalcInput | null) as UseQueryResult<PropellantMassCalcResult>;
const useQd = (i: In) => useQuantityDistanceCalc(i as QuantityDistanceCalcInput | null) as UseQueryResult<QuantityDistanceCalcResult>;
const useSurge = (i: In) => useSurgeCalc(i as SurgeCalcInput | null) as UseQueryResult<SurgeCalcResult>;
const useOxygen = (i: In) => useOxygenCalc(i as OxygenCalcInput | null) as UseQueryResult<OxygenCalcResult>;

function Out({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <>
      <dt className="font-bold">{label}</dt>
      <dd>{children}</dd>
    </>
  );
}

export function EngineeringChecksPage() {
  const me = useSignedInMe();
  const canAttach = canEditHazards(me.roles);
  const attach = (calc: CalcName) => (canAttach ? calc : undefined);
  return (
    <Page
      title="Engineering checks"
      kicker="Hazards"
      lead="Quick checks for hazard analysis: risk lookup, propellant load, blast quantity-distance, valve surge and oxygen level. Each answer shows its formula and sources."
    >
      <HazardsNav />
      <Notice tone="warning" title="Not a safety authority" className="mb-6">
        <p>{CAUTION_GOVERNING_CODE}</p>
      </Notice>
      <div className="grid gap-6 lg:grid-cols-2">
        <CalcCard
          title="Risk lookup"
          attachAs={attach('risk')}
          formula={<p>Find the severity column and the likelihood row in the MIL-STD-882E risk assessment matrix; the cell gives the risk level.</p>}
          fields={[
            { name: 'severity', label: 'Severity', options: MATRIX.severities.map((s) => ({ value: s.key, label: `${s.key} ${s.label}` })), defaultValue: '2' },
            { name: 'likelihood', label: 'Likelihood', options: MATRIX.likelihoods.map((l) => ({ value: l.key, label: `${l.key} ${l.label}` })), defaultValue: 'C' },
          ]}
          useResult={useRisk}
          renderResult={(r) => {
            let level = null;
            try {
              level = getLevel(MATRIX, r.level);
            } catch {
              level = null;
            }
            return (
              <>
                <p className="flex flex-wrap items-center gap-2">
                  <span className="font-bold">Risk level:</span> <RiskBadge level={level} />
                </p>
                <SourcesAndCautions sources={['MIL-STD-882E, Table III risk assessment matrix']} cautions={[CAUTION_GOVERNING_CODE]} />
              </>
            );
          }}
        />
        <CalcCard
          title="Oxygen percentage"
          attachAs={attach('oxygen')}
          formula={
            <p>
              Compare the measured oxygen (% by volume) with OSHA's limits: below 19.5 % is deficient, above 23.5 % enriched. NFPA 53 already treats anything above 21 % as
              oxygen-enriched for fire.
            </p>
          }
          fields={[{ name: 'percent', label: 'Oxygen reading', unit: '% by volume', defaultValue: '20.9' }]}
          useResult={useOxygen}
          renderResult={(r) => (
            <>
              <p className="flex flex-wrap items-center gap-2">
                <span className="font-bold">OSHA classification:</span>
                {r.classification === 'normal' ? (
                  <Badge tone="go" glyph="circle">
                    Normal
                  </Badge>
                ) : (
                  <Badge tone="danger" glyph="diamond">
                    {r.classification === 'deficient' ? 'Oxygen-deficient' : 'Oxygen-enriched'}
                  </Badge>
                )}
              </p>
              <p className="flex flex-wrap items-center gap-2">
                <span className="font-bold">NFPA 53 (above 21 %):</span>
                {r.nfpa53Enriched ? (
                  <Badge tone="caution" glyph="triangle">
                    Enriched for fire purposes
                  </Badge>
                ) : (
                  <Badge glyph="dash">Not enriched</Badge>
                )}
              </p>
              <SourcesAndCautions sources={r.sources} cautions={r.cautions} />
            </>
          )}
        />
        <CalcCard
          title="Propellant mass"
          attachAs={attach('propellant-mass')}
          formula={
            <p>
              Mass (kg) = density (kg/m³) × tank volume (L) ÷ 1000 × fill (%) ÷ 100. The density is the library value at one reference temperature; an ethanol-water blend is
              interpolated in a density table by its ethanol mass %.
            </p>
          }
          fields={[
            { name: 'propellant', label: 'Propellant', options: MASS_PROPELLANTS.map((p) => ({ value: p, label: propellantName(p) })), defaultValue: 'lox' },
            { name: 'volumeL', label: 'Tank volume', unit: 'L', defaultValue: '12' },
            { name: 'fillPercent', label: 'Fill', unit: '%', defaultValue: '90' },
            { name: 'ethanolMassPercent', label: 'Ethanol content', unit: '% by mass', hint: 'Only for an ethanol-water blend, e.g. 75.', required: false },
          ]}
          useResult={useMass}
          renderResult={(r) => (
            <>
              <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
                <Out label="Propellant mass">{fmt(r.massKg, 2)} kg</Out>
                <Out label="Density used">{fmt(r.densityKgM3, 1)} kg/m³</Out>
              </dl>
              <SourcesAndCautions sources={[r.source]} cautions={r.cautions} />
            </>
          )}
        />
        <CalcCard
          title="Quantity-distance (blast)"
          attachAs={attach('quantity-distance')}
          formula={
            <p>
              TNT equivalent W = propellant mass × TNT equivalence (10 % for LOX with a fuel on a static test stand). Distance D = K × W^(1/3), with K = 40, 24, 18 and 9
              ft/lb^(1/3) (×0.3967 for m/kg^(1/3)).
            </p>
          }
          fields={[
            { name: 'propellantKg', label: 'Total propellant mass', unit: 'kg', defaultValue: '20' },
            { name: 'combination', label: 'Propellant combination', options: QD_COMBINATIONS.map((c) => ({ value: c, label: QD_COMBINATION_LABELS[c] ?? c })), required: false, defaultValue: 'lox-alcohol' },
            { name: 'setting', label: 'Setting', options: QD_SETTINGS.map((s) => ({ value: s, label: QD_SETTING_LABELS[s] ?? s })), required: false, defaultValue: 'static-test-stand' },
            { name: 'tntPercent', label: 'TNT equivalence from your own hazard assessment', unit: '%', hint: 'Leave empty to use the listed value.', required: false },
          ]}
          useResult={useQd}
          renderResult={(r) => (
            <>
              <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
                <Out label="TNT equivalent">
                  {fmt(r.tntKg, 2)} kg ({fmt(r.tntPercentUsed, 1)} % of propellant)
                </Out>
                {(Object.keys(QD_DISTANCE_LABELS) as (keyof typeof QD_DISTANCE_LABELS)[]).map((k) => (
                  <Out key={k} label={QD_DISTANCE_LABELS[k]}>
                    {fmt(r.distancesM[k], 1)} m
                  </Out>
                ))}
              </dl>
              <SourcesAndCautions sources={r.sources} cautions={r.cautions} />
            </>
          )}
        />
        <CalcCard
          title="Valve surge (water hammer)"
          attachAs={attach('surge')}
          formula={
            <p>
              Joukowsky: pressure rise = density × wave speed × change in flow velocity. If the valve closes slower than 2 × pipe length ÷ wave speed, the rise shrinks in proportion.
            </p>
          }
          fields={[
            { name: 'fluid', label: 'Liquid', options: Object.entries(SURGE_FLUIDS).map(([k, f]) => ({ value: k, label: f.label })), defaultValue: 'lox' },
            { name: 'velocityChangeMps', label: 'Change in flow velocity', unit: 'm/s', defaultValue: '5' },
            { name: 'pipeLengthM', label: 'Pipe length', unit: 'm', required: false },
            { name: 'valveTimeS', label: 'Valve closing time', unit: 's', hint: 'Needs the pipe length.', required: false },
          ]}
          useResult={useSurge}
          renderResult={(r) => (
            <>
              <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
                <Out label="Pressure rise">
                  {fmt(r.deltaPressurePa / 1e6, 2)} MPa ({fmt(r.deltaPressurePa / 1e5, 1)} bar)
                </Out>
                <Out label="Wave speed">{fmt(r.waveSpeedMps, 0)} m/s</Out>
                <Out label="Closure">{r.regime === 'instantaneous' ? 'Instantaneous (worst case)' : 'Gradual'}</Out>
                {r.criticalTimeS !== undefined ? <Out label="Critical time 2L/c">{fmt(r.criticalTimeS, 3)} s</Out> : null}
              </dl>
              <SourcesAndCautions sources={r.sources} cautions={r.cautions} />
            </>
          )}
        />
      </div>
    </Page>
  );
}
