import { CalibrationStatus } from '../../shared/calibration-status/calibration-status-chip';

/** The latest calibration of an instrument. */
export interface CalibrationSummary {
  /** ISO date the calibration was done. */
  calibratedOn: string;
  /** ISO date the next one is due. */
  dueOn: string;
  /** Certificate reference. */
  certificate: string;
  status: CalibrationStatus;
}

/** One row of `GET /api/instruments`. */
export interface Instrument {
  id: number;
  /** Lab's asset tag, e.g. `PT-03`. */
  tag: string;
  name: string;
  /** What it measures: pressure gauge, thermocouple, … */
  kind: string;
  serialNumber: string;
  /** Measuring range, in `unit`. */
  rangeMin: number;
  rangeMax: number;
  unit: string;
  /** null when the instrument has never been calibrated. */
  calibration: CalibrationSummary | null;
}

export interface InstrumentList {
  items: Instrument[];
}
