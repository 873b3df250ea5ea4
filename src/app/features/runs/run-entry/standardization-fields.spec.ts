import { standardizationControls, standardizationFromSetup, standardizationSetup } from './standardization-fields';

describe('standardization run fields', () => {
  it('adds nothing for a measurement or a gas run', () => {
    const v = standardizationControls().getRawValue();
    expect(standardizationSetup(v, true)).toEqual({});
    expect(standardizationSetup({ ...v, purpose: 'standardization' }, false)).toEqual({});
  });

  it('writes an electrical heat source, and reads it back', () => {
    const v = { ...standardizationControls().getRawValue(), purpose: 'standardization' as const };
    const setup = standardizationSetup(v, true);
    expect(setup).toEqual({ purpose: 'standardization', heatSource: { kind: 'electrical' } });
    expect(standardizationFromSetup(setup)).toEqual({ purpose: 'standardization', kind: 'electrical' });
  });

  it('writes a reference material with its certificate U and k and a correction (SRM 39j defaults: 26 434 J/g, U = 3 J/g)', () => {
    const v = { ...standardizationControls().getRawValue(), purpose: 'standardization' as const, kind: 'reference-material' as const, massG: 1.0012, massU: 0.00002, correctionJ: 21.4, correctionU: 0.5 };
    const setup = standardizationSetup(v, true);
    expect(setup.heatSource).toEqual({
      kind: 'reference-material', material: 'benzoic acid, NIST SRM 39j', mass: { value: 1.0012, unit: 'g', u: 0.00002 },
      massicEnergy: { value: 26434, unit: 'J/g', U: 3, k: 2 }, corrections: [{ name: 'ignition wire', energy: { value: 21.4, unit: 'J', u: 0.5 } }],
    });
    expect(standardizationFromSetup(setup)).toMatchObject({ kind: 'reference-material', massG: 1.0012, massicEnergy: 26434, massicEnergyU: 3, correctionJ: 21.4 });
  });
});
