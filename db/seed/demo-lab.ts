/**
 * The demo lab: an invented institution, its people and apparatus. Every name and number here is
 * made up for demonstration; none describes a real lab, person or instrument.
 */
import { DEFAULT_LAB_NAME, DEMO_DOMAIN } from '../../server/config';
import type { Role } from '../schema';

export { DEMO_DOMAIN };
// The seed follows the server's default lab name (never the other way: server/ does not import db/seed).
export const DEMO_INSTITUTION = DEFAULT_LAB_NAME;
export const DEFAULT_DEMO_PASSWORD = 'qwell-demo-lab';

export const demoPeople: { role: Role; name: string }[] = [
  { role: 'technician', name: 'Lena Okonkwo' },
  { role: 'assistant', name: 'Mateo Brandt' },
  { role: 'investigator', name: 'Ingrid Halvorsen' },
  { role: 'quality', name: 'Samir Castellanos' },
  { role: 'admin', name: 'Ruth Adeyemi' },
];

export const demoEmail = (role: Role) => `${role}@${DEMO_DOMAIN}`;

export const demoProjects = [
  { code: 'GX', name: 'Gas expansion, teaching lab 2', description: 'Piston-cell expansions and compressions of N2, Ar and air.' },
  { code: 'CB', name: 'Bath calorimetry, Lab B', description: 'Electrical calibration and heat-capacity runs in bath calorimeter BC-1.' },
];

// Molar masses in kg/mol (IUPAC standard atomic weights; values from memory, rounded as commonly tabulated).
export const demoGases = [
  { code: 'N2', name: 'Nitrogen', molarMass: 0.0280134, model: 'shomate' },
  { code: 'O2', name: 'Oxygen', molarMass: 0.0319988, model: 'shomate' },
  { code: 'Ar', name: 'Argon', molarMass: 0.039948, model: 'shomate' },
  { code: 'CO2', name: 'Carbon dioxide', molarMass: 0.0440095, model: 'shomate' },
  { code: 'He', name: 'Helium', molarMass: 0.004002602, model: 'monatomic' },
  { code: 'air', name: 'Dry air', molarMass: 0.0289647, model: 'mixture' },
];

export const demoInstruments = [
  { tag: 'PG-2', name: 'Pressure transducer, piston cell', kind: 'pressure', manufacturer: 'Harrowgate instrument workshop', serialNumber: 'KG-40117', unit: 'kPa', rangeMin: 0, rangeMax: 1000, spec: { percentOfFullScale: 0.1, fullScale: 1000, resolution: 0.01 } },
  { tag: 'BA-1', name: 'Barometer, Lab B wall', kind: 'pressure', manufacturer: 'Harrowgate instrument workshop', serialNumber: 'KG-20931', unit: 'mbar', rangeMin: 800, rangeMax: 1100, spec: { percentOfReading: 0.02, resolution: 0.1 } },
  { tag: 'TC-7', name: 'Pt100 probe, piston cell', kind: 'temperature', manufacturer: 'Harrowgate electronics workshop', serialNumber: 'OS-7734', unit: 'degC', rangeMin: -50, rangeMax: 250, spec: { resolution: 0.01 } },
  { tag: 'TC-9', name: 'Pt100 probe, bath calorimeter', kind: 'temperature', manufacturer: 'Harrowgate electronics workshop', serialNumber: 'OS-7791', unit: 'degC', rangeMin: -20, rangeMax: 120, spec: { resolution: 0.001 } },
  { tag: 'LD-3', name: 'Displacement encoder, piston PC-3', kind: 'displacement', manufacturer: 'Harrowgate mechanical workshop', serialNumber: 'TM-1180', unit: 'mm', rangeMin: 0, rangeMax: 200, spec: { resolution: 0.01, percentOfReading: 0.05 } },
  { tag: 'SV-1', name: 'Syringe volume scale, piston cell', kind: 'volume', manufacturer: 'Harrowgate mechanical workshop', serialNumber: 'TM-2204', unit: 'mL', rangeMin: 0, rangeMax: 500, spec: { resolution: 0.1, percentOfReading: 0.1 } },
  { tag: 'VB-2', name: 'Gas burette, Lab B', kind: 'volume', manufacturer: 'Harrowgate glass workshop', serialNumber: 'HGW-0317', unit: 'L', rangeMin: 0, rangeMax: 2, spec: { resolution: 0.001, percentOfReading: 0.2 } },
  { tag: 'DV-4', name: 'Bench multimeter, heater voltage', kind: 'voltage', manufacturer: 'Harrowgate electronics workshop', serialNumber: 'WI-5520', unit: 'V', rangeMin: 0, rangeMax: 60, spec: { percentOfReading: 0.05, resolution: 0.001 } },
  { tag: 'DA-5', name: 'Bench multimeter, heater current', kind: 'current', manufacturer: 'Harrowgate electronics workshop', serialNumber: 'WI-5521', unit: 'A', rangeMin: 0, rangeMax: 10, spec: { percentOfReading: 0.1, resolution: 0.0001 } },
  { tag: 'PM-2', name: 'Heater power meter, piston cell', kind: 'power', manufacturer: 'Harrowgate electronics workshop', serialNumber: 'WI-5530', unit: 'W', rangeMin: 0, rangeMax: 100, spec: { percentOfReading: 0.1, resolution: 0.0001 } },
] as const;

/** Calibration dates relative to the seeding day, so the demo always shows a spread of statuses. */
export const demoCalibrations: { tag: string; ageDays: number; validDays: number; certificate: string; U: number; k: number }[] = [
  { tag: 'PG-2', ageDays: 120, validDays: 365, certificate: 'HIAT-CAL-2291', U: 0.8, k: 2 },
  { tag: 'BA-1', ageDays: 200, validDays: 365, certificate: 'HIAT-CAL-2204', U: 0.3, k: 2 },
  { tag: 'TC-7', ageDays: 345, validDays: 365, certificate: 'HIAT-CAL-2150', U: 0.05, k: 2 },
  { tag: 'TC-9', ageDays: 60, validDays: 365, certificate: 'HIAT-CAL-2310', U: 0.01, k: 2 },
  { tag: 'LD-3', ageDays: 400, validDays: 365, certificate: 'HIAT-CAL-2012', U: 0.02, k: 2 },
  { tag: 'SV-1', ageDays: 90, validDays: 365, certificate: 'HIAT-CAL-2288', U: 0.2, k: 2 },
  { tag: 'VB-2', ageDays: 150, validDays: 365, certificate: 'HIAT-CAL-2241', U: 0.002, k: 2 },
  { tag: 'DV-4', ageDays: 30, validDays: 365, certificate: 'HIAT-CAL-2330', U: 0.004, k: 2 },
  { tag: 'DA-5', ageDays: 30, validDays: 365, certificate: 'HIAT-CAL-2331', U: 0.0008, k: 2 },
  { tag: 'PM-2', ageDays: 45, validDays: 365, certificate: 'HIAT-CAL-2325', U: 0.0005, k: 2 },
];

export const demoApparatus = [
  { tag: 'PC-3', name: 'Piston cell PC-3', kind: 'piston-cell', heatLossCoefficient: 0.045, heatLossCoefficientU: 0.01, ratedPressure: 1.0e6, bore: 0.05, notes: 'Stainless cylinder with a lapped piston; relief valve set to 900 kPa.' },
  { tag: 'BC-1', name: 'Bath calorimeter BC-1', kind: 'bath-calorimeter', heatCapacity: 4850, heatCapacityU: 12, heatLossCoefficient: 0.12, heatLossCoefficientU: 0.02, notes: 'Dewar bath, 1 L water, 50 W immersion heater.' },
];
