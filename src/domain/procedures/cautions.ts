/**
 * A step's cautions, resolved from what it links: the hazards' mitigations and the propellants' handling
 * cautions and PPE. Printed in the order the trade prints them: warnings, then cautions, then notes.
 *
 * Classification rule (Holdfire's own, see docs/procedures.md):
 *  - A propellant handling caution keeps the library's classification: 'warning' can harm people, 'caution'
 *    can harm equipment. A propellant's PPE list becomes one note.
 *  - A mitigation the crew carries out or watches for (signage, procedures, training and PPE; warning devices)
 *    becomes a warning. The register does not record whether a hazard threatens people or only equipment, so
 *    Holdfire takes the safer reading: people.
 *  - A mitigation built into the hardware (design selection or alteration, engineered features) becomes a note:
 *    the crew does nothing for it at the step, but should know the protection it relies on and whether it has
 *    been verified.
 *  - Mitigations of closed hazards are left out; open, mitigating, awaiting-acceptance and accepted hazards count.
 *  - The step's own note comes first among the notes. The same text from two links is shown once, with both sources.
 */
import type { HazardStatus, MitigationKind } from '../hazards/mitigation';
import { byPrecedence } from '../hazards/mitigation';
import type { HandlingCaution, PropellantId } from '../propellants/library';

export const CAUTION_LEVELS = ['warning', 'caution', 'note'] as const;
export type CautionLevel = (typeof CAUTION_LEVELS)[number];

export const CAUTION_LEVEL_LABELS: Readonly<Record<CautionLevel, string>> = {
  warning: 'Warning',
  caution: 'Caution',
  note: 'Note',
};

export type CautionSource =
  | { type: 'hazard'; hazardId: number; hazardCode: string; mitigationId: number; mitigationKind: MitigationKind; verificationStatus: string }
  | { type: 'propellant'; propellantId: PropellantId; cautionKey: string | null }
  | { type: 'step' };

export interface ResolvedCaution {
  level: CautionLevel;
  text: string;
  sources: CautionSource[];
}

export interface HazardForCautions {
  id: number;
  code: string;
  status: HazardStatus;
  mitigations: readonly { id: number; kind: MitigationKind; description: string; verificationStatus: string }[];
}

export interface PropellantForCautions {
  id: PropellantId;
  name: string;
  cautions: readonly HandlingCaution[];
  ppe: readonly string[];
}

/** Kinds the crew acts on at the step; the rest are built into the hardware. */
const CREW_KINDS: ReadonlySet<MitigationKind> = new Set(['procedure-ppe', 'warning-device']);

export function mitigationLevel(kind: MitigationKind): CautionLevel {
  return CREW_KINDS.has(kind) ? 'warning' : 'note';
}

export function ppeNoteText(propellantName: string, ppe: readonly string[]): string {
  return `PPE for ${propellantName.toLowerCase()}: ${ppe.join('; ')}.`;
}

export function resolveCautions(
  step: { hazardIds: readonly number[]; propellants: readonly PropellantId[]; note: string },
  hazards: ReadonlyMap<number, HazardForCautions>,
  propellants: ReadonlyMap<PropellantId, PropellantForCautions>,
): ResolvedCaution[] {
  const found: ResolvedCaution[] = [];
  const add = (level: CautionLevel, text: string, source: CautionSource) => {
    const same = found.find((c) => c.level === level && c.text === text);
    if (same) same.sources.push(source);
    else found.push({ level, text, sources: [source] });
  };

  if (step.note.trim() !== '') add('note', step.note.trim(), { type: 'step' });
  for (const id of new Set(step.hazardIds)) {
    const h = hazards.get(id);
    if (!h || h.status === 'closed') continue;
    for (const m of byPrecedence(h.mitigations)) {
      add(mitigationLevel(m.kind), m.description, {
        type: 'hazard',
        hazardId: h.id,
        hazardCode: h.code,
        mitigationId: m.id,
        mitigationKind: m.kind,
        verificationStatus: m.verificationStatus,
      });
    }
  }
  for (const id of new Set(step.propellants)) {
    const p = propellants.get(id);
    if (!p) continue;
    for (const c of p.cautions) add(c.severity, c.text, { type: 'propellant', propellantId: p.id, cautionKey: c.key });
    if (p.ppe.length > 0) add('note', ppeNoteText(p.name, p.ppe), { type: 'propellant', propellantId: p.id, cautionKey: null });
  }
  // A stable sort keeps the link order inside each level.
  return found.sort((a, b) => CAUTION_LEVELS.indexOf(a.level) - CAUTION_LEVELS.indexOf(b.level));
}
