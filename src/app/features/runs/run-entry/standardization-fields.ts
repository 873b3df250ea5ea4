import { FormControl, FormGroup } from '@angular/forms';

import type { RunSetup } from '../run-entry.models';

/**
 * The "standardization run" part of the entry form: a calorimeter run with a known heat input, electrical
 * (∫U·I dt from the heater channels) or a reference material (mass × certified massic energy, with one named
 * correction energy such as the ignition wire). Defaults: benzoic acid, NIST SRM 39j, 26 434 J/g, U = 3 J/g (k = 2).
 */
export function standardizationControls() {
  const num = (v: number | null = null) => new FormControl<number | null>(v);
  return new FormGroup({
    purpose: new FormControl<'measurement' | 'standardization'>('measurement', { nonNullable: true }),
    kind: new FormControl<'electrical' | 'reference-material'>('electrical', { nonNullable: true }),
    material: new FormControl('benzoic acid, NIST SRM 39j', { nonNullable: true }),
    massG: num(),
    massU: num(),
    massicEnergy: num(26434),
    massicEnergyU: num(3),
    coverageFactor: num(2),
    correctionName: new FormControl('ignition wire', { nonNullable: true }),
    correctionJ: num(),
    correctionU: num(),
  });
}

export type StandardizationValue = ReturnType<ReturnType<typeof standardizationControls>['getRawValue']>;

/** The purpose and heat source the setup document gets (nothing for a measurement or a gas run). */
export function standardizationSetup(v: StandardizationValue, calorimeter: boolean): Partial<RunSetup> {
  if (!calorimeter || v.purpose !== 'standardization') return {};
  if (v.kind === 'electrical') return { purpose: 'standardization', heatSource: { kind: 'electrical' } };
  const withU = (u: number | null) => (u !== null ? { u } : {});
  return {
    purpose: 'standardization',
    heatSource: {
      kind: 'reference-material',
      material: v.material,
      mass: { value: v.massG, unit: 'g', ...withU(v.massU) },
      massicEnergy: { value: v.massicEnergy, unit: 'J/g', ...(v.massicEnergyU !== null ? { U: v.massicEnergyU, k: v.coverageFactor ?? 2 } : {}) },
      corrections: v.correctionJ !== null ? [{ name: v.correctionName, energy: { value: v.correctionJ, unit: 'J', ...withU(v.correctionU) } }] : [],
    },
  };
}

interface StoredHeatSource {
  kind?: string;
  material?: string;
  mass?: { value?: number; u?: number };
  massicEnergy?: { value?: number; U?: number; k?: number };
  corrections?: Array<{ name?: string; energy?: { value?: number; u?: number } }>;
}

/** Form values from a stored setup. */
export function standardizationFromSetup(setup: RunSetup): Partial<StandardizationValue> {
  if (setup['purpose'] !== 'standardization') return { purpose: 'measurement' };
  const src = (setup['heatSource'] ?? {}) as StoredHeatSource;
  if (src.kind !== 'reference-material') return { purpose: 'standardization', kind: 'electrical' };
  const c = src.corrections?.[0];
  return {
    purpose: 'standardization', kind: 'reference-material', material: src.material ?? '',
    massG: src.mass?.value ?? null, massU: src.mass?.u ?? null,
    massicEnergy: src.massicEnergy?.value ?? null, massicEnergyU: src.massicEnergy?.U ?? null, coverageFactor: src.massicEnergy?.k ?? 2,
    correctionName: c?.name ?? 'ignition wire', correctionJ: c?.energy?.value ?? null, correctionU: c?.energy?.u ?? null,
  };
}
