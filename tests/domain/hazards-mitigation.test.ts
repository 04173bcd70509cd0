import { describe, expect, it } from 'vitest';
import {
  HAZARD_STATUSES,
  MITIGATION_KINDS,
  MITIGATION_KIND_INFO,
  byPrecedence,
  canTransition,
  checkResidual,
  nextStatuses,
  transitionKind,
  type MitigationKind,
} from '../../src/domain/hazards/mitigation';

const m = (...kinds: MitigationKind[]) => kinds.map((kind) => ({ kind }));

describe('order of precedence', () => {
  it('follows MIL-STD-882E section 4.3.4, 1 to 5', () => {
    // MIL-STD-882E section 4.3.4 (F2): design selection, design alteration, engineered features,
    // warning devices, signage/procedures/training/PPE.
    expect(MITIGATION_KINDS.map((k) => MITIGATION_KIND_INFO[k].precedence)).toEqual([1, 2, 3, 4, 5]);
    expect(MITIGATION_KINDS).toEqual([
      'design-selection',
      'design-alteration',
      'engineered-feature',
      'warning-device',
      'procedure-ppe',
    ]);
    expect(MITIGATION_KIND_INFO['procedure-ppe'].label).toMatch(/PPE/);
  });

  it('sorts mitigations most effective first', () => {
    const sorted = byPrecedence(m('procedure-ppe', 'engineered-feature', 'design-selection', 'warning-device'));
    expect(sorted.map((x) => x.kind)).toEqual(['design-selection', 'engineered-feature', 'warning-device', 'procedure-ppe']);
  });
});

describe('checkResidual', () => {
  // MIL-STD-882E section 4.3.4 (F2): no warning, caution or PPE moves a hazard to probability F.
  it('refuses Eliminated when only procedures, training or PPE were applied', () => {
    const r = checkResidual({ initialLikelihood: 'C', residualLikelihood: 'F', mitigations: m('procedure-ppe', 'procedure-ppe') });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('eliminated-without-design-change');
      expect(r.message).toMatch(/cannot make a hazard Eliminated/);
    }
  });

  it('refuses Eliminated with warning devices only, or warnings plus PPE', () => {
    expect(checkResidual({ initialLikelihood: 'B', residualLikelihood: 'F', mitigations: m('warning-device') }).ok).toBe(false);
    expect(checkResidual({ initialLikelihood: 'B', residualLikelihood: 'F', mitigations: m('warning-device', 'procedure-ppe') }).ok).toBe(false);
  });

  it('allows Eliminated when a design or engineered measure is among them', () => {
    for (const kind of ['design-selection', 'design-alteration', 'engineered-feature'] as const) {
      expect(checkResidual({ initialLikelihood: 'C', residualLikelihood: 'F', mitigations: m('procedure-ppe', kind) })).toEqual({ ok: true });
    }
  });

  it('allows procedures to lower likelihood short of Eliminated', () => {
    expect(checkResidual({ initialLikelihood: 'C', residualLikelihood: 'E', mitigations: m('procedure-ppe') })).toEqual({ ok: true });
  });

  it('allows residual equal to initial, with or without mitigations', () => {
    expect(checkResidual({ initialLikelihood: 'D', residualLikelihood: 'D', mitigations: [] })).toEqual({ ok: true });
    expect(checkResidual({ initialLikelihood: 'F', residualLikelihood: 'F', mitigations: [] })).toEqual({ ok: true });
  });

  it('refuses a residual likelihood worse than the initial one', () => {
    const r = checkResidual({ initialLikelihood: 'D', residualLikelihood: 'B', mitigations: m('design-alteration') });
    expect(r).toMatchObject({ ok: false, code: 'residual-worse-than-initial' });
  });

  it('refuses a lower likelihood with no mitigation at all', () => {
    expect(checkResidual({ initialLikelihood: 'B', residualLikelihood: 'D', mitigations: [] })).toMatchObject({
      ok: false,
      code: 'lowered-without-mitigation',
    });
  });

  it('refuses unknown likelihoods and mitigation kinds', () => {
    expect(checkResidual({ initialLikelihood: 'Z', residualLikelihood: 'D', mitigations: [] })).toMatchObject({ code: 'unknown-likelihood' });
    expect(
      checkResidual({ initialLikelihood: 'B', residualLikelihood: 'D', mitigations: [{ kind: 'luck' as MitigationKind }] }),
    ).toMatchObject({ code: 'unknown-mitigation-kind' });
  });
});

describe('hazard status transitions', () => {
  const allowed: [string, string, string][] = [
    ['open', 'mitigating', 'advance'],
    ['open', 'awaiting-acceptance', 'advance'],
    ['mitigating', 'awaiting-acceptance', 'advance'],
    ['awaiting-acceptance', 'accepted', 'advance'],
    ['awaiting-acceptance', 'mitigating', 'return'],
    ['accepted', 'closed', 'advance'],
    ['accepted', 'open', 'reopen'],
    ['closed', 'open', 'reopen'],
  ];

  it.each(allowed)('%s -> %s is allowed (%s)', (from, to, kind) => {
    expect(canTransition(from, to)).toBe(true);
    expect(transitionKind(from, to)).toBe(kind);
  });

  it('forbids every other pair, including staying put', () => {
    const ok = new Set(allowed.map(([f, t]) => `${f}>${t}`));
    for (const from of HAZARD_STATUSES) {
      for (const to of HAZARD_STATUSES) {
        expect(canTransition(from, to)).toBe(ok.has(`${from}>${to}`));
      }
    }
    // Skipping acceptance is the transition that matters most to refuse.
    expect(canTransition('mitigating', 'accepted')).toBe(false);
    expect(canTransition('open', 'closed')).toBe(false);
  });

  it('rejects unknown statuses', () => {
    expect(canTransition('open', 'done')).toBe(false);
    expect(transitionKind('draft', 'open')).toBeNull();
  });

  it('lists next statuses', () => {
    expect(nextStatuses('awaiting-acceptance')).toEqual(['mitigating', 'accepted']);
    expect(nextStatuses('closed')).toEqual(['open']);
  });
});
