import type { RunState } from './runs.models';

// Run entry at the bench: create, edit, readings, submit (and the shapes the run page shares).
/** Processes a run can claim. */
/** 'free-form': a path that follows no named process (loops, free paths); no model work and no claim flags. */
export type RunProcess = 'isobaric' | 'isochoric' | 'isothermal' | 'adiabatic' | 'polytropic' | 'calorimetric' | 'free-form';

export const RUN_PROCESSES: readonly RunProcess[] = [
  'isobaric',
  'isochoric',
  'isothermal',
  'adiabatic',
  'polytropic',
  'calorimetric',
  'free-form',
];

/** Reading channels besides time, in grid order. */
export type ReadingChannel = 'pressure' | 'volume' | 'displacement' | 'temperature' | 'voltage' | 'current' | 'power';

export const READING_CHANNELS: readonly ReadingChannel[] = [
  'pressure',
  'volume',
  'displacement',
  'temperature',
  'voltage',
  'current',
  'power',
];

/** A measured value with its unit and, optionally, its standard uncertainty in the same unit. */
export interface EnteredQuantity {
  value: number;
  unit: string;
  u?: number;
}

/** How one channel was entered (written by PUT readings). */
export interface ChannelEntry {
  unit: string;
  /** Register instrument that read it. */
  instrumentId?: number;
  /** Or an instrument described inside the run (imported run documents). */
  instrument?: string;
  reference?: 'absolute' | 'gauge';
}

export type GasSetup =
  | { model: 'species'; species: string }
  | { model: 'equipartition'; f: number }
  | { model: 'calorimeter' };

export type AmountSetup =
  | { from: 'moles'; value: number; u?: number }
  | { from: 'mass'; mass: EnteredQuantity; molarMass?: { value: number; u?: number } }
  | { from: 'initialState'; Z?: number };

/** The run's setup document (server/runs/run-setup.ts, checked by server/runs/setup-validation.ts); unknown keys are kept as they are. */
export interface RunSetup {
  gas?: GasSetup;
  amount?: AmountSetup;
  /** Polytropic index n. */
  processIndex?: number;
  /** pressure.instrumentId: the register barometer that read it. */
  ambient?: { pressure?: EnteredQuantity & { instrumentId?: number }; temperature?: EnteredQuantity };
  /** Apparatus values the run carries itself (imported documents, run-specific values). */
  apparatus?: { name?: string; ratedPressure?: EnteredQuantity; [key: string]: unknown };
  time?: { unit: 'ms' | 's' | 'min' | 'h' | 'iso'; origin?: string };
  channels?: Partial<Record<ReadingChannel, ChannelEntry>>;
  [key: string]: unknown;
}

/** `GET /api/runs/:id/checklist`: what a draft still lacks before submit, in the form's words. */
export interface RunChecklistResponse {
  runId: number;
  version: number;
  complete: boolean;
  missing: { field: string; label: string; message: string }[];
}

/** Body of `POST /api/runs`. */
export interface CreateRunBody {
  projectId: number;
  title: string;
  process: RunProcess;
  runDate: string;
  gasId?: number;
  apparatusId?: number;
  setup?: RunSetup;
}

/** Body of `PATCH /api/runs/:id`. */
export interface UpdateRunBody {
  version: number;
  title?: string;
  process?: RunProcess;
  runDate?: string;
  gasId?: number | null;
  apparatusId?: number | null;
  setup?: RunSetup;
}

/** Body of `PUT /api/runs/:id/readings`: values in each channel's own unit; null for an empty cell. */
export interface ReadingsBody {
  version: number;
  time: { unit: 'ms' | 's' | 'min' | 'h'; values: number[] };
  channels: Partial<Record<ReadingChannel, ChannelEntry & { values: (number | null)[] }>>;
}

/** What the server answers to a write: the run's new version at least. */
export interface RunVersion {
  id: number;
  code?: string;
  version: number;
}

/** SI units of the readings the server returns. */
export const READING_SI_UNITS: Readonly<Record<'time' | ReadingChannel, string>> = {
  time: 's',
  pressure: 'Pa',
  volume: 'm³',
  displacement: 'm',
  temperature: 'K',
  voltage: 'V',
  current: 'A',
  power: 'W',
};

export type RunReadings = { count: number; time: number[] } & Record<ReadingChannel, (number | null)[]>;
