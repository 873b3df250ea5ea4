import {
  cubicMetresToLitres,
  litresToCubicMetres,
  metresToMillimetres,
  millimetresToMetres,
  pascalTo,
  pressureToPascal,
} from './apparatus-units';

// Exact SI factors (SI Brochure, 9th edition): 1 kPa = 10³ Pa, 1 bar = 10⁵ Pa, 1 mm = 10⁻³ m, 1 L = 10⁻³ m³.
describe('apparatus units', () => {
  it('sends kPa and bar as Pa', () => {
    expect(pressureToPascal(1000, 'kPa')).toBe(1_000_000);
    expect(pressureToPascal(101.325, 'kPa')).toBe(101_325);
    expect(pressureToPascal(10, 'bar')).toBe(1_000_000);
    expect(pressureToPascal(2.5, 'bar')).toBe(250_000);
  });

  it('shows Pa back in kPa and bar', () => {
    expect(pascalTo(1_000_000, 'kPa')).toBe(1000);
    expect(pascalTo(1_000_000, 'bar')).toBe(10);
    expect(pascalTo(101_325, 'bar')).toBe(1.01325);
  });

  it('sends a bore in mm as m without binary noise', () => {
    expect(millimetresToMetres(50)).toBe(0.05);
    expect(millimetresToMetres(32.5)).toBe(0.0325);
    expect(metresToMillimetres(0.05)).toBe(50);
    expect(metresToMillimetres(0.0325)).toBe(32.5);
  });

  it('sends a volume in L as m³', () => {
    expect(litresToCubicMetres(1.2)).toBe(0.0012);
    expect(litresToCubicMetres(0.5)).toBe(0.0005);
    expect(cubicMetresToLitres(0.0012)).toBe(1.2);
    expect(cubicMetresToLitres(0.0005)).toBe(0.5);
  });
});
