import { InstrumentKind } from '@contract';

import { CalibrationStatus } from '../../shared/calibration-status/calibration-status-chip';

/** How the maker states the instrument's accuracy; any part may be missing. */
export interface InstrumentSpec {
  /** Accuracy as a percentage of the reading. */
  percentOfReading?: number;
  /** Accuracy as a percentage of full scale. */
  percentOfFullScale?: number;
  /** Full scale, in the instrument's unit. */
  fullScale?: number;
  /** Smallest step the display shows, in the instrument's unit. */
  resolution?: number;
}

/** The latest calibration of an instrument. */
export interface CalibrationSummary {
  /** ISO date the calibration was done. */
  calibratedOn: string;
  /** ISO date the next one is due. */
  dueOn: string;
  /** Certificate reference. */
  certificate: string;
  /** Expanded uncertainty U, in the instrument's unit. */
  expandedUncertainty: number;
  /** Coverage factor k of U. */
  coverageFactor: number;
  /** Corrections the certificate states, in the instrument's unit: reading × gain + offset (either may be missing). */
  corrections: { offset?: number; gain?: number };
  status: CalibrationStatus;
}

/** One row of `GET /api/instruments`. */
export interface Instrument {
  id: number;
  /** Lab's asset tag, e.g. `PT-03`. */
  tag: string;
  name: string;
  kind: InstrumentKind;
  manufacturer: string;
  serialNumber: string;
  /** Measuring range, in `unit`; null when not recorded. */
  rangeMin: number | null;
  rangeMax: number | null;
  unit: string;
  spec: InstrumentSpec;
  /** null when the instrument has never been calibrated. */
  calibration: CalibrationSummary | null;
}

export interface InstrumentList {
  items: Instrument[];
}

/** One certificate in an instrument's history. */
export interface CalibrationRecord extends CalibrationSummary {
  id: number;
  notes: string;
}

/** Body of `GET /api/instruments/:id`: the instrument with every calibration, newest first. */
export interface InstrumentDetail extends Omit<Instrument, 'calibration'> {
  calibrations: CalibrationRecord[];
}

/** Body of `POST /api/instruments`. */
export interface NewInstrument {
  tag: string;
  name: string;
  kind: InstrumentKind;
  unit: string;
  manufacturer?: string;
  serialNumber?: string;
  rangeMin?: number;
  rangeMax?: number;
  spec?: InstrumentSpec;
}

/** Body of `POST /api/instruments/:id/calibrations`. */
export interface NewCalibration {
  calibratedOn: string;
  dueOn: string;
  certificate: string;
  /** U, in the instrument's unit. */
  expandedUncertainty: number;
  coverageFactor?: number;
  corrections?: { offset?: number; gain?: number };
  notes?: string;
}
