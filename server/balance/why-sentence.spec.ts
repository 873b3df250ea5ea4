import { correctionsClause, type AppliedCorrection } from '../../contract/corrections';
import { checkRunDocument } from '../engine';
import { loadFixture } from '../../testing/fixture-runs';
import { dominantSource, whySentence, type WhyInput } from './why-sentence';

// The sentence only words what the stored result already holds; each case below takes the result of a
// demo run (fixtures/runs) through the engine and checks the sentence against the result's own figures.
const check = (doc: unknown) => {
  const res = checkRunDocument(doc, { draws: 0 });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return res.result;
};

describe('whySentence', () => {
  it('says nothing for a balance that closes', () => {
    const result = check(loadFixture('isobaric'));
    expect(result.verdict).toBe('closes');
    expect(whySentence(result)).toBeNull();
  });

  it('gives the heat-loss coefficient that would close a balance whose heat leak was forgotten', () => {
    const result = check(loadFixture('calorimetric-heat-leak-forgotten'));
    expect(result.verdict).toBe('breaks');
    const hint = result.hints.find((h) => h.code === 'FORGOTTEN_HEAT_LEAK')!;
    expect(hint).toBeDefined();
    const h = Number(hint.value!.toPrecision(2)).toString();
    expect(whySentence(result)).toBe(`No heat leak was accounted for: a heat-loss coefficient h \u2248 ${h} W/K would close the balance.`);
  });

  it('names the dominant source of u(r), its share and what halving it buys for an indeterminate run', () => {
    const doc = loadFixture('isobaric');
    doc.apparatus!.heatLossCoefficient!.u = 0.003; // u(h) so wide the balance says nothing
    const result = check(doc);
    expect(result.verdict).toBe('indeterminate');
    const source = dominantSource(result)!;
    // The share is the group's variance over u²(r), summed from the budget lines of that group.
    const groupVariance = result.budget.filter((b) => b.group === source.group).reduce((sum, b) => sum + b.contribution, 0);
    expect(source.share).toBeCloseTo(groupVariance / result.residual.u ** 2, 12);
    expect(source.group).toBe('heat-loss coefficient');
    const sentence = whySentence(result)!;
    expect(sentence).toContain(`mostly from heat-loss coefficient (${Number((100 * source.share).toPrecision(2))} % of u²(r))`);
    expect(sentence).toContain(`wider than the lab's limit of ${Number(result.indeterminateLimit.toPrecision(2))} J`);
    const halved = result.hints.find((h) => h.code === 'DOMINANT_SOURCE')!.value!;
    expect(sentence).toContain(`would bring U(r) to ${Number(halved.toPrecision(2))} J`);
  });

  it('falls back to the residual and the largest source when no recording slip explains a break', () => {
    const input: WhyInput = {
      verdict: 'breaks', En: 3.2, indeterminateLimit: 500,
      residual: { r: -48, u: 7.5, U: 15, k: 2 },
      budget: [{ group: 'PG-2', contribution: 36 }, { group: 'PG-2', contribution: 9 }, { group: 'TC-1', contribution: 11.25 }],
      hints: [],
    };
    // PG-2: (36 + 9) / 7.5² = 0.8 of the variance.
    expect(whySentence(input)).toBe(
      'ΔU and Q − W differ by r = \u221248 J, 3.2 times its expanded uncertainty U(r) = 15 J, and no common recording slip explains it; ' +
        'the largest source of u(r) is PG-2 (80 % of u²(r)).',
    );
  });

  it('prefers the slip whose correction brings En lowest', () => {
    const input: WhyInput = {
      verdict: 'breaks', En: 4, indeterminateLimit: 500, residual: { r: 40, u: 5, U: 10, k: 2 }, budget: [],
      hints: [
        { code: 'CURRENT_UNIT', message: 'Heater current logged in A may be in mA; read in mA: the balance would close (En = 0.9).', alteredEn: 0.9 },
        { code: 'GAUGE_AS_ABSOLUTE', message: 'Pressure logged as absolute may be gauge pressure; read as gauge: the balance would close (En = 0.2).', alteredEn: 0.2 },
      ],
    };
    expect(whySentence(input)).toMatch(/^Pressure logged as absolute/);
  });

  describe('after the check applied a certificate\'s correction', () => {
    // Invented demo certificate for the fixture's thermometer TC-9, in force on the run date 2026-03-14: corrected =
    // reading × 1.0004 − 0.05 °C (applying it to the readings is GUM, JCGM 100:2008 §3.2.3; server/engine/corrections.ts).
    const corrected = (name: 'calorimetric' | 'calorimetric-heat-leak-forgotten') => {
      const doc = loadFixture(name);
      const tc9 = doc.instruments.find((i) => i.id === 'TC-9')!;
      tc9.calibration = { ...tc9.calibration!, correction: { certificate: 'HGT-CAL-2026-118', gain: 1.0004, offset: -0.05, unit: 'degC' } };
      return check(doc);
    };

    it('names the certificate after the reason a balance breaks', () => {
      const result = corrected('calorimetric-heat-leak-forgotten');
      expect(result.verdict).toBe('breaks');
      expect(result.corrections).toHaveLength(1);
      const h = Number(result.hints.find((x) => x.code === 'FORGOTTEN_HEAT_LEAK')!.value!.toPrecision(2)).toString();
      expect(whySentence(result)).toBe(
        `No heat leak was accounted for: a heat-loss coefficient h \u2248 ${h} W/K would close the balance. ` +
          'Readings corrected by certificate HGT-CAL-2026-118 (TC-9) before the check.',
      );
      // The same run without the correction: the reason alone.
      expect(whySentence({ ...result, corrections: [] })).not.toContain('Readings corrected');
    });

    it('still says nothing for a balance that closes', () => {
      const result = corrected('calorimetric');
      expect(result.corrections).toHaveLength(1);
      expect(result.verdict).toBe('closes');
      expect(whySentence(result)).toBeNull();
    });

    it('names each certificate once, and an instrument whose run document named none by its calibration', () => {
      const tc9: AppliedCorrection = { reading: 'temperature', instrument: 'TC-9', instrumentName: null, certificate: 'HGT-CAL-2026-118', gain: 1.0004, offset: -0.05, unit: 'degC' };
      const pg2: AppliedCorrection = { reading: 'pressure', instrument: 'PG-2', instrumentName: null, certificate: 'HGT-CAL-2026-031', gain: 1, offset: -0.2, unit: 'kPa' };
      const bar: AppliedCorrection = { reading: 'ambientPressure', instrument: 'BP-1', instrumentName: null, certificate: null, gain: 1, offset: 0.1, unit: 'hPa' };
      expect(correctionsClause([])).toBeNull();
      expect(correctionsClause(undefined)).toBeNull();
      expect(correctionsClause([tc9, { ...tc9, reading: 'pressure' }])).toBe('Readings corrected by certificate HGT-CAL-2026-118 (TC-9) before the check.');
      expect(correctionsClause([tc9, pg2, bar])).toBe(
        'Readings corrected by certificates HGT-CAL-2026-118 (TC-9) and HGT-CAL-2026-031 (PG-2) and the calibration of BP-1 before the check.',
      );
    });
  });
});
