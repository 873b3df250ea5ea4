// The energy equivalent ε of a calorimeter from one standardization run: ε = Q_known / ΔT_corrected, with an
// uncertainty budget (GUM 5.1.2: relative uncertainties of a quotient add in quadrature).
// Q_known is the electrical energy ∫U·I dt, or, for a reference material, mass × certified massic energy plus
// named correction energies (ignition wire, acid formation…): W = (Q·g + e₁ + e₂)/t as ASTM D240 §8.1 writes it.
import type { Quantity } from './run-document';
import { toSi } from './units';

export interface MassicEnergy extends Quantity {
  /** Expanded uncertainty and its coverage factor, as a certificate states them; u = U/k. */
  U?: number;
  k?: number;
}

export type HeatSource =
  | { kind: 'electrical' }
  | { kind: 'reference-material'; material: string; mass: Quantity; massicEnergy: MassicEnergy; corrections?: Array<{ name: string; energy: Quantity }> };

/** Massic energy units the format reads, and J/g per unit. */
export const MASSIC_ENERGY_FACTORS: Readonly<Record<string, number>> = { 'J/g': 1, 'kJ/g': 1e3, 'MJ/kg': 1e3, 'J/kg': 1e-3 };

/** One source of the budget: its standard uncertainty in its own unit and its sensitivity in J/K per unit. */
export interface EnergyEquivalentEntry {
  source: string;
  unit: string;
  value: number;
  u: number;
  /** ∂ε/∂x, (J/K) per `unit`. */
  sensitivity: number;
  /** |∂ε/∂x|·u, J/K. */
  contribution: number;
  /** Share of u²(ε), 0..1. */
  share: number;
}

export interface KnownHeat {
  value: number;
  u: number;
  /** Sources of u(Q) in J: name, unit, value, u and ∂Q/∂x (J per unit). */
  sources: Array<{ source: string; unit: string; value: number; u: number; sensitivity: number }>;
  description: string;
}

export interface EnergyEquivalent {
  value: number;
  u: number;
  knownHeat: { value: number; u: number; description: string };
  budget: EnergyEquivalentEntry[];
}

/** Q_known of a reference material, J: m·q + Σ e_i. */
export function referenceMaterialHeat(src: Extract<HeatSource, { kind: 'reference-material' }>): KnownHeat {
  const mg = toSi('mass', src.mass.unit, src.mass.value) * 1e3; // g
  const umg = toSi('mass', src.mass.unit, src.mass.u ?? 0) * 1e3;
  const f = MASSIC_ENERGY_FACTORS[src.massicEnergy.unit];
  const q = src.massicEnergy.value * f; // J/g
  const uqEntered = src.massicEnergy.u ?? (src.massicEnergy.U !== undefined ? src.massicEnergy.U / (src.massicEnergy.k ?? 2) : 0);
  const uq = uqEntered * f;
  const sources: KnownHeat['sources'] = [
    { source: `${src.material} mass`, unit: 'g', value: mg, u: umg, sensitivity: q },
    { source: `${src.material} certified massic energy`, unit: 'J/g', value: q, u: uq, sensitivity: mg },
  ];
  let value = mg * q;
  for (const c of src.corrections ?? []) {
    const e = toSi('energy', c.energy.unit, c.energy.value);
    value += e;
    sources.push({ source: `correction: ${c.name}`, unit: 'J', value: e, u: toSi('energy', c.energy.unit, c.energy.u ?? 0), sensitivity: 1 });
  }
  const u = Math.sqrt(sources.reduce((s, x) => s + (x.sensitivity * x.u) ** 2, 0));
  return { value, u, sources, description: `${mg.toPrecision(6)} g ${src.material} × ${q.toPrecision(6)} J/g${(src.corrections ?? []).length ? ' + corrections' : ''}` };
}

/** The thermometer behind the rise: its relative gain uncertainty (from ± % of reading) and its name for the budget. */
export interface ThermometerGain {
  label: string;
  relativeU: number;
}

/**
 * ε = Q / ΔT with its budget. The corrected rise enters with the u of its drift fits and reading scatter; the
 * thermometer's gain g, which scales ΔT_c to ΔT_c·(1 + g), is a row of its own with ∂ε/∂g = −Q/ΔT_c = −ε.
 */
export function energyEquivalent(known: KnownHeat, rise: { value: number; u: number; method: string }, thermometer?: ThermometerGain): EnergyEquivalent {
  const dT = rise.value;
  const value = known.value / dT;
  const entries = [
    ...known.sources.map((s) => ({ ...s, sensitivity: s.sensitivity / dT })),
    { source: `corrected temperature rise (${rise.method}): drift fits and reading scatter`, unit: 'K', value: dT, u: rise.u, sensitivity: -known.value / (dT * dT) },
    ...(thermometer && thermometer.relativeU > 0
      ? [{ source: `thermometer gain (${thermometer.label})`, unit: '1 (relative gain)', value: 0, u: thermometer.relativeU, sensitivity: -value }]
      : []),
  ];
  const u2 = entries.reduce((s, x) => s + (x.sensitivity * x.u) ** 2, 0);
  const budget = entries
    .map((x) => ({ ...x, contribution: Math.abs(x.sensitivity) * x.u, share: u2 > 0 ? (x.sensitivity * x.u) ** 2 / u2 : 0 }))
    .sort((a, b) => b.contribution - a.contribution);
  return { value, u: Math.sqrt(u2), knownHeat: { value: known.value, u: known.u, description: known.description }, budget };
}
