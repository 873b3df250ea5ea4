import type { RunTimeUnit } from '../../contract/api/runs';
import type { InferSelectModel } from 'drizzle-orm';
import type { apparatus as apparatusTable, calibrations, instruments, readings, runs } from '../../db/schema';
import { RUN_FORMAT, RUN_FORMAT_VERSION, type Apparatus, type Instrument, type Readings, type RunDocument } from '../engine/run-document';
import type { CertificateCorrection } from '../engine/corrections';
import { differenceToSi, fromSi, toSi, type UnitKind } from '../engine/units';
import { badRequest, type FieldError } from '../core/problem';
import { TEXT_LIMITS } from '../../contract/text-limits';
import { columnOf, readingAt, readingsToSi, TIME_FACTORS, type ColumnsInput } from './readings-columns';
import { CHANNELS, MAX_DECIMALS, channelNames, isDecimals, type ChannelName, type ChannelSetup, type RunSetup } from './run-setup';
import { isRecordId } from '../core/route-params';

export type ReadingRow = Omit<InferSelectModel<typeof readings>, 'runId'>;
type RegisterInstrument = InferSelectModel<typeof instruments> & { calibration: InferSelectModel<typeof calibrations> | null };

export { MAX_SECONDS, MAX_SI_MAGNITUDE } from './readings-columns';

/** Readings as people send them: one array per channel, in the channel's own unit. */
export interface ReadingsInput {
  time: { unit: RunTimeUnit; values: Array<number | string> };
  channels: Partial<Record<ChannelName, ChannelSetup & { values: Array<number | null> }>>;
}

/** Converts entered readings to SI rows; every bad cell is reported by channel and reading number (readingsToSi's checks). */
export function readingsToRows(input: ReadingsInput): { rows: ReadingRow[]; time: RunSetup['time']; channels: RunSetup['channels'] } {
  const channels: ColumnsInput['channels'] = {};
  for (const [name, channel] of Object.entries(input.channels) as Array<[ChannelName, ChannelSetup & { values: Array<number | null> }]>) {
    if (channel) channels[name] = { ...channel, values: columnOf(channel.values) };
  }
  const converted = readingsToSi({ time: { unit: input.time.unit, values: columnOf(input.time.values) }, channels });
  return { rows: Array.from({ length: converted.si.count }, (_, i) => readingAt(converted.si, i)), time: converted.time, channels: converted.channels };
}

/** Splits a full run document into what the runs table, its setup and its readings hold. */
export function documentToStorage(doc: RunDocument) {
  const r = doc.readings;
  const channels: ReadingsInput['channels'] = {};
  for (const name of channelNames) {
    const c = (r as unknown as Record<string, (ChannelSetup & { values: number[] }) | undefined>)[name];
    if (c) channels[name] = { unit: c.unit, values: c.values, ...(c.instrument ? { instrument: c.instrument } : {}), ...(c.reference ? { reference: c.reference } : {}) };
  }
  const { rows, time, channels: channelSetup } = readingsToRows({ time: r.time, channels });
  const setup: RunSetup = {
    gas: doc.gas,
    amount: doc.amount,
    processIndex: doc.process.index,
    ambient: doc.ambient,
    apparatus: doc.apparatus,
    apparatusSource: 'run',
    instruments: doc.instruments,
    time,
    channels: channelSetup,
    ...(doc.purpose ? { purpose: doc.purpose } : {}),
    ...(doc.heatSource ? { heatSource: doc.heatSource } : {}),
    ...(doc.periods ? { periods: doc.periods } : {}),
  };
  return { setup, rows, apparatusConstants: doc.apparatus };
}

/** A register instrument described in the unit of the channel it reads, with its calibration on the run date. */
export function registerInstrument(inst: RegisterInstrument, channelUnit: string, kind: UnitKind): Instrument {
  const diff = (v: number) => differenceToSi(kind, inst.unit, v) / differenceToSi(kind, channelUnit, 1);
  const point = (v: number) => fromSi(kind, channelUnit, toSi(kind, inst.unit, v));
  const spec = inst.spec ?? {};
  const cal = inst.calibration;
  return {
    id: inst.tag,
    name: inst.name,
    ...(spec.percentOfReading !== undefined ? { percentOfReading: spec.percentOfReading } : {}),
    ...(spec.percentOfFullScale !== undefined ? { percentOfFullScale: spec.percentOfFullScale, fullScale: diff(spec.fullScale ?? 0) } : {}),
    ...(spec.resolution !== undefined ? { resolution: diff(spec.resolution) } : {}),
    ...(inst.rangeMin !== null && inst.rangeMax !== null ? { range: { min: point(inst.rangeMin), max: point(inst.rangeMax) } } : {}),
    ...(cal ? { calibration: { U: diff(cal.expandedUncertainty), k: cal.coverageFactor, ...correctionOf(cal, inst.unit) }, calibrationDate: cal.calibratedOn, dueDate: cal.dueOn } : {}),
  };
}

/**
 * The correction the certificate states, as it states it: in the instrument's unit, with the certificate's number
 * (the engine applies it to the readings, corrections.ts). Nothing when the certificate states none.
 */
function correctionOf(cal: InferSelectModel<typeof calibrations>, unit: string): { correction?: CertificateCorrection } {
  // A null stored before nulls were left out at the edge is "not stated" too.
  const { gain, offset } = cal.corrections ?? {};
  if (typeof gain !== 'number' && typeof offset !== 'number') return {};
  return { correction: { certificate: cal.certificate, ...(typeof gain === 'number' ? { gain } : {}), ...(typeof offset === 'number' ? { offset } : {}), unit } };
}

export interface DocumentContext {
  run: InferSelectModel<typeof runs>;
  rows: readonly ReadingRow[];
  gasCode: string | null;
  apparatus: InferSelectModel<typeof apparatusTable> | null;
  /** Register instruments named by the run's channels, each with the calibration valid on the run date. */
  register: ReadonlyMap<number, RegisterInstrument>;
  lab: string;
  operator: string;
  /**
   * The approved standardization in force on the run date: its ε replaces the register's heat capacity, and its
   * mean fitted h the register's heat-loss coefficient when the lab applies it (QWELL_USE_FITTED_HEAT_LOSS).
   */
  standardization?: PinnedConstants | null;
}

export interface PinnedConstants {
  energyEquivalent: number;
  energyEquivalentU: number;
  heatLossCoefficient?: number | null;
  heatLossCoefficientU?: number | null;
  /** The lab setting: runs pinned to a standardization use its fitted h. */
  applyHeatLoss?: boolean;
}

/**
 * Whether a run's document takes its h from the pinned standardization: the lab applies fitted h, the
 * standardization has one, and the run does not carry its own apparatus values (a complete run document, or an
 * h typed for this run, take precedence as they do over the register).
 */
export function pinnedHeatLossApplies(setup: RunSetup, pinned: PinnedConstants | null | undefined): boolean {
  return !!pinned?.applyHeatLoss && typeof pinned.heatLossCoefficient === 'number' && setup.apparatusSource !== 'run' && setup.apparatus?.heatLossCoefficient === undefined;
}

function apparatusOf(a: DocumentContext['apparatus'], setup: RunSetup, pinned?: DocumentContext['standardization']): Apparatus {
  const extra = setup.apparatus;
  if (setup.apparatusSource === 'run') return { ...(extra ?? {}) };
  const q = (value: number | null | undefined, unit: string, u?: number | null) =>
    value === null || value === undefined ? undefined : { value, unit, ...(u !== null && u !== undefined ? { u } : {}) };
  const out: Apparatus = {
    name: extra?.name ?? a?.name,
    heatCapacity: pinned ? q(pinned.energyEquivalent, 'J/K', pinned.energyEquivalentU) : q(a?.heatCapacity, 'J/K', a?.heatCapacityU),
    heatLossCoefficient: pinnedHeatLossApplies(setup, pinned)
      ? q(pinned!.heatLossCoefficient, 'W/K', pinned!.heatLossCoefficientU)
      : q(a?.heatLossCoefficient, 'W/K', a?.heatLossCoefficientU),
    ratedPressure: a?.ratedPressure === null || a?.ratedPressure === undefined ? undefined : { value: a.ratedPressure, unit: 'Pa', reference: a.ratedPressureReference ?? 'absolute' },
    pistonBore: q(a?.bore, 'm'),
    vesselVolume: q(a?.fixedVolume, 'm3'),
    ...extra,
  };
  return Object.fromEntries(Object.entries(out).filter(([, v]) => v !== undefined)) as Apparatus;
}

/** Rebuilds the run document of a stored run, in the units it was entered in. */
export function storageToDocument(ctx: DocumentContext): RunDocument {
  const setup = (ctx.run.setup ?? {}) as RunSetup;
  const instrumentsOut: Instrument[] = [...(setup.instruments ?? [])];
  const readingsOut: Record<string, unknown> = {};
  const timeUnit = setup.time?.unit ?? 's';
  readingsOut['time'] =
    timeUnit === 'iso'
      ? { unit: 'iso', values: ctx.rows.map((r) => new Date(Date.parse(setup.time?.origin ?? '1970-01-01T00:00:00Z') + r.time * 1000).toISOString()) }
      : { unit: timeUnit, values: ctx.rows.map((r) => r.time / TIME_FACTORS[timeUnit]) };
  for (const name of channelNames) {
    const channel = setup.channels?.[name];
    if (!channel) continue;
    const kind = CHANNELS[name];
    const out: Record<string, unknown> = { unit: channel.unit, values: ctx.rows.map((r) => (r[name] === null ? NaN : fromSi(kind, channel.unit, r[name]!))) };
    if (channel.reference) out['reference'] = channel.reference;
    const registered = channel.instrumentId !== undefined ? ctx.register.get(channel.instrumentId) : undefined;
    if (registered) {
      instrumentsOut.push(registerInstrument(registered, channel.unit, kind));
      out['instrument'] = registered.tag;
    } else if (channel.instrument) {
      out['instrument'] = channel.instrument;
    }
    readingsOut[name] = out;
  }
  const ambient = { ...(setup.ambient ?? {}) };
  const baro = ambient.pressure;
  if (baro) {
    const { instrumentId, ...quantity } = baro;
    const registered = instrumentId !== undefined ? ctx.register.get(instrumentId) : undefined;
    if (registered) instrumentsOut.push(registerInstrument(registered, baro.unit, 'pressure'));
    ambient.pressure = registered ? { ...quantity, instrument: registered.tag } : quantity;
  }
  // Two channels may share one instrument: describe it once.
  const uniqueInstruments = [...new Map(instrumentsOut.map((i) => [i.id, i])).values()];
  const gas = setup.gas ?? (ctx.gasCode ? { model: 'species' as const, species: ctx.gasCode as never } : { model: 'calorimeter' as const });
  return {
    format: RUN_FORMAT,
    version: RUN_FORMAT_VERSION,
    id: `${ctx.run.code}/${ctx.run.revision}`,
    title: ctx.run.title,
    lab: ctx.lab,
    operator: ctx.operator,
    runDate: ctx.run.runDate,
    process: { claimed: ctx.run.process, ...(setup.processIndex !== undefined ? { index: setup.processIndex } : {}) },
    gas,
    ...(setup.amount ? { amount: setup.amount } : {}),
    ambient,
    apparatus: apparatusOf(ctx.apparatus, setup, ctx.standardization),
    instruments: uniqueInstruments,
    readings: readingsOut as unknown as Readings,
    ...(setup.purpose ? { purpose: setup.purpose } : {}),
    ...(setup.heatSource ? { heatSource: setup.heatSource } : {}),
    ...(setup.periods ? { periods: setup.periods } : {}),
  };
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Checks the shape of a readings body before any conversion; says which part is wrong. */
export function parseReadingsInput(body: { time?: unknown; channels?: unknown }): ReadingsInput {
  const errors: FieldError[] = [];
  const time = body.time;
  if (!isPlainObject(time) || !['ms', 's', 'min', 'h', 'iso'].includes(time['unit'] as string) || !Array.isArray(time['values'])) {
    errors.push({ field: 'time', message: 'time must be { unit: "ms" | "s" | "min" | "h" | "iso", values: [...] }' });
  }
  const channels = body.channels;
  if (!isPlainObject(channels)) {
    errors.push({ field: 'channels', message: 'channels must be an object with one entry per channel' });
  } else {
    for (const [name, c] of Object.entries(channels)) {
      if (!(channelNames as string[]).includes(name)) {
        errors.push({ field: `channels.${name}`, message: `unknown channel "${name}"; channels are ${channelNames.join(', ')}` });
      } else if (!isPlainObject(c) || typeof c['unit'] !== 'string' || !Array.isArray(c['values'])) {
        errors.push({ field: `channels.${name}`, message: `${name} must be { unit, values: [...], instrumentId?, reference?, decimals? }` });
      } else {
        if (c['instrumentId'] !== undefined && !isRecordId(c['instrumentId'])) errors.push({ field: `channels.${name}.instrumentId`, message: 'instrumentId must be the id of an instrument of the register (a whole number from 1)' });
        const instrument = c['instrument'];
        if (instrument !== undefined && (typeof instrument !== 'string' || instrument.length > TEXT_LIMITS.instrumentId)) {
          errors.push({ field: `channels.${name}.instrument`, message: `channels.${name}.instrument is the id of an instrument described in the run, text of at most ${TEXT_LIMITS.instrumentId} characters` });
        }
        if (c['reference'] !== undefined && (name !== 'pressure' || !['absolute', 'gauge'].includes(c['reference'] as string))) {
          errors.push({ field: `channels.${name}.reference`, message: 'reference is "absolute" or "gauge", and only for pressure' });
        }
        if (c['decimals'] !== undefined && !isDecimals(c['decimals'])) {
          errors.push({ field: `channels.${name}.decimals`, message: `decimals is the number of decimals the readings were entered with, a whole number from 0 to ${MAX_DECIMALS}` });
        }
        const extra = Object.keys(c).filter((k) => !['unit', 'values', 'instrumentId', 'instrument', 'reference', 'decimals'].includes(k));
        if (extra.length) errors.push({ field: `channels.${name}`, message: `unknown field(s) ${extra.join(', ')}` });
      }
    }
  }
  if (errors.length) throw badRequest(errors.map((e) => e.message).join('; '), errors);
  return body as ReadingsInput;
}
