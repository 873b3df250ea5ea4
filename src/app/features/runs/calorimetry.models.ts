/** Calorimetry fields of a balance result (docs/run-document.md, "Calorimetry"); K, s, J/K, W/K. */
export interface ValueU {
  value: number;
  u: number;
}

export interface DriftLine {
  /** K/s */
  rate: number;
  u: number;
  meanTemperature: number;
  meanTime: number;
  readings: number;
}

export interface TemperatureRise {
  observed: number;
  corrected: ValueU;
  method: 'regnault-pfaundler' | 'dickinson';
  alternative: ValueU & { method: 'regnault-pfaundler' | 'dickinson' };
  periods: { source: 'document' | 'detected'; mainStart: number; mainEnd: number; startReading: number; endReading: number; foreReadings: number; afterReadings: number; dickinsonTime: number };
  drift: { fore: DriftLine; after: DriftLine };
  /** Parts of u(corrected): the drift fits and reading scatter, and the thermometer's gain (K); absent in results before engine 2.1. */
  uncertainty?: { fit: number; thermometerGain: number; thermometer: string | null };
}

export interface CalorimetryResult {
  purpose?: 'measurement' | 'standardization';
  temperatureRise?: TemperatureRise | null;
  heatLeakFit?: { k: ValueU; convergenceTemperature: ValueU; h: ValueU | null; heatCapacity: (ValueU & { source: string }) | null } | null;
  energyEquivalent?: (ValueU & { knownHeat: { value: number; u: number; description: string } }) | null;
  /** The approved standardization whose ε the run used (stored results only). */
  standardization?: {
    id: number; energyEquivalent: ValueU; effectiveFrom: string; signedBy: string; signedAt: string;
    /** The standardization's mean fitted h, and whether the run used it (the lab setting QWELL_USE_FITTED_HEAT_LOSS). */
    heatLossCoefficient?: ValueU | null; heatLossApplied?: boolean;
  } | null;
}

export const METHOD_LABEL: Readonly<Record<string, string>> = { 'regnault-pfaundler': 'Regnault–Pfaundler', dickinson: "Dickinson's extrapolation" };
