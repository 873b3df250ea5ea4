import { formatMeasurement, roundTo, sig } from './report-format';
import { niceTicks, thin } from './pv-diagram';
import { pdfText } from './pdf-layout';

describe('formatMeasurement (GUM, JCGM 100:2008, 7.2.6)', () => {
  it('rounds U to two significant digits and x to the same decimal place', () => {
    // GUM 7.2.6's own example (quoted from memory): y = 10.057 62 Ω with uc = 27 mΩ is stated as 10.058 Ω.
    expect(formatMeasurement(10.05762, 0.027, 'Ω')).toBe('10.058 ± 0.027 Ω');
    expect(formatMeasurement(123.4567, 0.02345, 'J')).toBe('123.457 ± 0.023 J');
    expect(formatMeasurement(-4.96, 2.349, 'J')).toBe('-5.0 ± 2.3 J');
  });

  it('rounds to tens or hundreds when U is large, and carries a rounded-up U to the next digit', () => {
    expect(formatMeasurement(56789.3, 1234, 'J')).toBe('56800 ± 1200 J');
    expect(formatMeasurement(1.23456, 0.0996)).toBe('1.23 ± 0.10');
  });

  it('says so when there is no uncertainty or no value', () => {
    expect(formatMeasurement(5.1234567, 0, 'J')).toBe('5.12346 J (no uncertainty)');
    expect(formatMeasurement(NaN, 1)).toBe('not defined');
  });

  it('prints rounded values without a negative zero or an exponent', () => {
    expect(roundTo(-0.0004, 2)).toBe('0.00');
    expect(roundTo(-20, -2)).toBe('0');
    expect(sig(0.000012345)).toBe('1.23e-5');
  });
});

describe('diagram helpers', () => {
  it('chooses 1-2-5 ticks that cover the data', () => {
    const t = niceTicks(0, 487);
    expect(t.step).toBe(100);
    expect(t.ticks).toEqual([0, 100, 200, 300, 400, 500]);
    const flat = niceTicks(1.2, 1.2);
    expect(flat.min).toBeLessThan(1.2);
    expect(flat.max).toBeGreaterThan(1.2);
  });

  it('thins long series evenly and keeps both ends', () => {
    const idx = thin(100_001, 1000);
    expect(idx).toHaveLength(1000);
    expect(idx[0]).toBe(0);
    expect(idx[999]).toBe(100_000);
    expect(thin(5)).toEqual([0, 1, 2, 3, 4]);
  });

  it('spells out symbols that Helvetica cannot print', () => {
    expect(pdfText('ΔU ≤ 1 → γ')).toBe('Delta U <= 1 -> gamma');
    expect(pdfText('25 °C ± 0.1')).toBe('25 °C ± 0.1');
  });
});
