// Calorimetry fields of a balance result are the contract's (contract/api/result.ts).
export type { CalorimetryResult, DriftLine, TemperatureRise, ValueU } from '@contract';

export const METHOD_LABEL: Readonly<Record<string, string>> = { 'regnault-pfaundler': 'Regnault–Pfaundler', dickinson: "Dickinson's extrapolation" };
