import { describe, expect, it } from 'vitest';
import { historyFieldName, historyValue } from '../../src/features/hazards/lib/history';

describe('hazard history in words', () => {
  it('names hazard and mitigation fields', () => {
    expect(historyFieldName('residualSeverity')).toBe('Residual severity');
    expect(historyFieldName('mitigation:7')).toBe('Mitigation 7');
    expect(historyFieldName('mitigation:7.verificationStatus')).toBe('Mitigation 7: verification');
    expect(historyFieldName('mitigation:7.evidence')).toBe('Mitigation 7: evidence');
  });

  it('reads a whole mitigation as a sentence, not key: value pairs', () => {
    const added = historyValue('mitigation:7', {
      id: 7,
      kind: 'engineered-feature',
      description: 'Burst disc on the LOX tank vent',
      owner: 'Dev Castellano',
      verificationMethod: 'Rating plate checked',
      verificationStatus: 'verified',
      evidence: [],
    });
    expect(added).toBe(
      'Incorporate engineered features or devices: Burst disc on the LOX tank vent; owner Dev Castellano; verified by Rating plate checked; verification Verified',
    );
    expect(added).not.toMatch(/verificationStatus|"id"/);
  });

  it('words severities, likelihoods, statuses and lists', () => {
    // MIL-STD-882E Table I and Table II names.
    expect(historyValue('residualSeverity', '1')).toBe('1 Catastrophic');
    expect(historyValue('initialLikelihood', 'D')).toBe('D Remote');
    // A team matrix key the built-in matrix does not know is shown as it is.
    expect(historyValue('initialLikelihood', 'L3')).toBe('L3');
    expect(historyValue('status', 'awaiting-acceptance')).toBe('Awaiting acceptance');
    expect(historyValue('status', { status: 'mitigating', note: 'Valve timing retest' })).toBe('Mitigating; note: Valve timing retest');
    expect(historyValue('propellants', ['lox', 'ethanol'])).toBe('Liquid oxygen; Ethanol');
    expect(historyValue('causes', [])).toBe('—');
    expect(historyValue('residualSeverity', null)).toBe('—');
  });

  it('words evidence, signatures and cleared signatures', () => {
    expect(historyValue('mitigation:2.evidence', { id: 4, calc: 'surge', label: 'Main valve surge' })).toBe('Main valve surge (frozen surge calculation)');
    expect(historyValue('acceptance', { role: 'safety', riskLevel: 'serious' })).toBe('as Safety officer, for a serious residual risk');
    expect(historyValue('acceptances', [{ userName: 'Priya Halloran', role: 'safety' }])).toBe('Priya Halloran as Safety officer');
    expect(historyValue('acceptances', { cleared: 'risk assessment changed' })).toBe('Cleared: risk assessment changed');
  });
});
