import type { RunTimeUnit } from '../../contract/api/runs';
import type { CalorimetryFields } from '../engine/run-document-calorimetry';
import { CHANNEL_KINDS, type AmountSpec, type Apparatus, type GasSpec, type Instrument, type Quantity } from '../engine/run-document';

/** The reading channels a run can have, and the engine's unit kind for each (the run document's own table). */
export const CHANNELS = CHANNEL_KINDS;
export type ChannelName = keyof typeof CHANNELS;
export const channelNames = Object.keys(CHANNELS) as ChannelName[];

/** How one channel was entered: its unit, the instrument that read it, and for pressure its reference. */
export interface ChannelSetup {
  unit: string;
  /** An instrument of the lab's register (its calibration on the run date is looked up). */
  instrumentId?: number;
  /** Or an instrument described inside the run (from an imported run document). */
  instrument?: string;
  reference?: 'absolute' | 'gauge';
  /** Decimals the readings were entered (or imported) with, so that 3.000 V is shown back as 3.000 V. */
  decimals?: number;
}

/** Most decimals a channel's entered digits may record (beyond a double's 15–17 significant digits is noise). */
export const MAX_DECIMALS = 12;
export const isDecimals = (v: unknown): v is number => Number.isInteger(v) && (v as number) >= 0 && (v as number) <= MAX_DECIMALS;

/**
 * Everything about a run except its readings and the columns of the runs table: what the run
 * document says, with channels pointing at register instruments. Stored as runs.setup (jsonb).
 */
export interface RunSetup {
  gas?: GasSpec;
  amount?: AmountSpec;
  processIndex?: number;
  /** The barometric pressure may name the register barometer that read it (its specification enters the budget). */
  ambient?: { pressure?: Quantity & { instrumentId?: number; instrument?: string }; temperature?: Quantity };
  /**
   * Apparatus values of this run; they take precedence over the apparatus register (e.g. a dead volume
   * measured for this run, or the constants of an imported run document).
   */
  apparatus?: Apparatus;
  /**
   * 'run': the run came as a complete run document, whose apparatus values are the whole truth; the
   * register's values for the linked apparatus are not mixed in. Default: register plus `apparatus`.
   */
  apparatusSource?: 'register' | 'run';
  /** Instruments described in the run itself rather than in the register. */
  instruments?: Instrument[];
  time?: { unit: RunTimeUnit; origin?: string };
  channels?: Partial<Record<ChannelName, ChannelSetup>>;
  notes?: string;
  /** Calorimetry (docs/run-document.md): a standardization run and its known heat input, and the main period. */
  purpose?: CalorimetryFields['purpose'];
  heatSource?: CalorimetryFields['heatSource'];
  periods?: CalorimetryFields['periods'];
}
