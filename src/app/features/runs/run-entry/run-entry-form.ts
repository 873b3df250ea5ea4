import { AbstractControl, FormControl, FormGroup, ValidationErrors, Validators } from '@angular/forms';
import type { TimeUnit } from '@contract';

import {
  CreateRunBody,
  READING_CHANNELS,
  ReadingChannel,
  ReadingsBody,
  RunProcess,
  RunSetup,
  UpdateRunBody,
} from '../run-entry.models';
import { RunRecord } from '../run-detail.models';
import { Gas } from '../../gases/gases.models';
import { ReadingsSheet, SheetKey } from './readings-grid/readings-sheet';
import { CHANNEL_KINDS, DEFAULT_UNITS, displayFromSi, fromSi } from './unit-table';
import { standardizationControls, standardizationFromSetup, standardizationSetup } from './standardization-fields';

export type GasModel = 'species' | 'equipartition' | 'calorimeter';
export type AmountFrom = 'none' | 'moles' | 'mass' | 'initialState';
export type { TimeUnit };

function channelGroup(name: ReadingChannel) {
  return new FormGroup({
    enabled: new FormControl(false, { nonNullable: true }),
    unit: new FormControl(DEFAULT_UNITS[CHANNEL_KINDS[name]], { nonNullable: true }),
    instrumentId: new FormControl<number | null>(null),
    reference: new FormControl<'absolute' | 'gauge'>('absolute', { nonNullable: true }),
  });
}

export type ChannelForm = ReturnType<typeof channelGroup>;

const optionalNumber = () => new FormControl<number | null>(null);

/** The run entry form; every control typed. Rules that tie fields together live in runFormRules. */
export function createRunForm(today: string) {
  return new FormGroup(
    {
      projectId: new FormControl<number | null>(null, Validators.required),
      title: new FormControl('', {
        nonNullable: true,
        validators: [Validators.required, Validators.minLength(3), Validators.maxLength(200)],
      }),
      process: new FormControl<RunProcess | null>(null, Validators.required),
      runDate: new FormControl(today, {
        nonNullable: true,
        validators: [Validators.required, Validators.pattern(/^\d{4}-\d{2}-\d{2}$/)],
      }),
      processIndex: optionalNumber(),
      gasModel: new FormControl<GasModel>('species', { nonNullable: true }),
      gasId: new FormControl<number | null>(null),
      degreesOfFreedom: optionalNumber(),
      amountFrom: new FormControl<AmountFrom>('moles', { nonNullable: true }),
      moles: optionalNumber(),
      molesU: optionalNumber(),
      mass: optionalNumber(),
      massUnit: new FormControl('g', { nonNullable: true }),
      massU: optionalNumber(),
      compressibility: optionalNumber(),
      apparatusId: new FormControl<number | null>(null),
      ambientPressure: optionalNumber(),
      ambientPressureUnit: new FormControl('kPa', { nonNullable: true }),
      ambientPressureU: optionalNumber(),
      /** The register barometer that read the ambient pressure: its specification enters the budget. */
      ambientPressureInstrumentId: new FormControl<number | null>(null),
      ambientTemperature: optionalNumber(),
      ambientTemperatureUnit: new FormControl('degC', { nonNullable: true }),
      ambientTemperatureU: optionalNumber(),
      timeUnit: new FormControl<TimeUnit>('s', { nonNullable: true }),
      standardization: standardizationControls(),
      channels: new FormGroup({
        pressure: channelGroup('pressure'),
        volume: channelGroup('volume'),
        displacement: channelGroup('displacement'),
        temperature: channelGroup('temperature'),
        voltage: channelGroup('voltage'),
        current: channelGroup('current'),
        power: channelGroup('power'),
      }),
    },
    { validators: runFormRules },
  );
}

export type RunForm = ReturnType<typeof createRunForm>;
export type RunFormValue = ReturnType<RunForm['getRawValue']>;

/** What each rule that ties fields together says when it is broken. */
export const RULE_MESSAGES: Readonly<Record<string, string>> = {
  gasRequired: 'Choose the gas, or switch to an equipartition gas or a calorimeter run.',
  degreesOfFreedomRequired: 'Give the degrees of freedom f (3 for a monatomic gas, 5 for a diatomic one).',
  processIndexRequired: 'A polytropic run needs its index n.',
  amountRequired: 'Give the amount of gas, or choose another way to find it.',
  gaugeNeedsAmbient: 'Gauge pressure readings need the ambient (barometric) pressure to become absolute.',
};

/** Rules across fields; errors sit on the form itself and are shown beside the fields they name. */
export function runFormRules(control: AbstractControl): ValidationErrors | null {
  const v = (control as RunForm).getRawValue();
  const errors: ValidationErrors = {};
  if (v.gasModel === 'species' && v.gasId === null) {
    errors['gasRequired'] = true;
  }
  if (v.gasModel === 'equipartition' && !(v.degreesOfFreedom !== null && v.degreesOfFreedom > 0)) {
    errors['degreesOfFreedomRequired'] = true;
  }
  if (v.process === 'polytropic' && v.processIndex === null) {
    errors['processIndexRequired'] = true;
  }
  if (v.gasModel !== 'calorimeter' && ((v.amountFrom === 'moles' && v.moles === null) || (v.amountFrom === 'mass' && v.mass === null))) {
    errors['amountRequired'] = true;
  }
  if (v.channels.pressure.enabled && v.channels.pressure.reference === 'gauge' && v.ambientPressure === null) {
    errors['gaugeNeedsAmbient'] = true;
  }
  return Object.keys(errors).length ? errors : null;
}

/** The channels switched on, in grid order. */
export function enabledChannels(value: RunFormValue): ReadingChannel[] {
  return READING_CHANNELS.filter((name) => value.channels[name].enabled);
}

/** The POST body, or null while project, title, process or date are still missing. */
export function createBody(form: RunForm, gases: readonly Gas[], base: RunSetup = {}, sheet?: ReadingsSheet): CreateRunBody | null {
  const { projectId, title, process, runDate } = form.controls;
  if (projectId.invalid || title.invalid || process.invalid || runDate.invalid) {
    return null;
  }
  const v = form.getRawValue();
  const gasId = v.gasModel === 'species' ? v.gasId : null;
  return {
    projectId: v.projectId!,
    title: v.title.trim(),
    process: v.process!,
    runDate: v.runDate,
    ...(gasId !== null ? { gasId } : {}),
    ...(v.apparatusId !== null ? { apparatusId: v.apparatusId } : {}),
    setup: setupOf(v, gases, base, sheet),
  };
}

/** The PATCH body: every field the form owns, at the given version. */
export function updateBody(version: number, form: RunForm, gases: readonly Gas[], base: RunSetup = {}, sheet?: ReadingsSheet): UpdateRunBody {
  const v = form.getRawValue();
  return {
    version,
    title: v.title.trim(),
    ...(v.process ? { process: v.process } : {}),
    runDate: v.runDate,
    gasId: v.gasModel === 'species' ? v.gasId : null,
    apparatusId: v.apparatusId,
    setup: setupOf(v, gases, base, sheet),
  };
}

const withU = (u: number | null) => (u !== null ? { u } : {});

/**
 * The setup document from the form, on top of what the run already held: keys the form does not
 * own (notes, run-specific apparatus values, described instruments) pass through unchanged.
 */
export function setupOf(v: RunFormValue, gases: readonly Gas[], base: RunSetup = {}, sheet?: ReadingsSheet): RunSetup {
  const { gas: _gas, amount: _amount, processIndex: _n, ambient: _ambient, channels: _channels, purpose: _p, heatSource: _h, ...kept } = base;
  const setup: RunSetup = { ...kept, time: { unit: v.timeUnit }, ...standardizationSetup(v.standardization, v.gasModel === 'calorimeter') };
  const species = gases.find((g) => g.id === v.gasId)?.code;
  if (v.gasModel === 'species' && species) {
    setup.gas = { model: 'species', species };
  } else if (v.gasModel === 'equipartition' && v.degreesOfFreedom !== null) {
    setup.gas = { model: 'equipartition', f: v.degreesOfFreedom };
  } else if (v.gasModel === 'calorimeter') {
    setup.gas = { model: 'calorimeter' };
  }
  if (v.gasModel !== 'calorimeter') {
    if (v.amountFrom === 'moles' && v.moles !== null) {
      setup.amount = { from: 'moles', value: v.moles, ...withU(v.molesU) };
    } else if (v.amountFrom === 'mass' && v.mass !== null) {
      setup.amount = { from: 'mass', mass: { value: v.mass, unit: v.massUnit, ...withU(v.massU) } };
    } else if (v.amountFrom === 'initialState') {
      setup.amount = { from: 'initialState', ...(v.compressibility !== null ? { Z: v.compressibility } : {}) };
    }
  }
  if (v.process === 'polytropic' && v.processIndex !== null) {
    setup.processIndex = v.processIndex;
  }
  const ambient: NonNullable<RunSetup['ambient']> = {};
  if (v.ambientPressure !== null) {
    ambient.pressure = {
      value: v.ambientPressure, unit: v.ambientPressureUnit, ...withU(v.ambientPressureU),
      ...(v.ambientPressureInstrumentId !== null ? { instrumentId: v.ambientPressureInstrumentId } : {}),
    };
  }
  if (v.ambientTemperature !== null) {
    ambient.temperature = { value: v.ambientTemperature, unit: v.ambientTemperatureUnit, ...withU(v.ambientTemperatureU) };
  }
  if (ambient.pressure || ambient.temperature) {
    setup.ambient = ambient;
  }
  const channels = channelEntries(v, base, sheet);
  if (Object.keys(channels).length) {
    setup.channels = channels;
  }
  return setup;
}

/** Each channel switched on, with the decimals its readings were typed with (from the sheet, else as stored). */
function channelEntries(v: RunFormValue, base: RunSetup, sheet?: ReadingsSheet): NonNullable<RunSetup['channels']> {
  const out: NonNullable<RunSetup['channels']> = {};
  for (const name of enabledChannels(v)) {
    const c = v.channels[name];
    const described = base.channels?.[name]?.instrument;
    const decimals = sheet ? sheet.decimalsOf(name) : (base.channels?.[name]?.decimals ?? null);
    out[name] = {
      unit: c.unit,
      ...(c.instrumentId !== null ? { instrumentId: c.instrumentId } : described ? { instrument: described } : {}),
      ...(name === 'pressure' ? { reference: c.reference } : {}),
      ...(decimals !== null ? { decimals } : {}),
    };
  }
  return out;
}

/** The PUT readings body for the visible columns. */
export function readingsBody(version: number, v: RunFormValue, sheet: ReadingsSheet, base: RunSetup = {}): ReadingsBody {
  const names = enabledChannels(v);
  const values = sheet.values(['time', ...names]);
  const entries = channelEntries(v, base, sheet);
  const channels: ReadingsBody['channels'] = {};
  for (const name of names) {
    channels[name] = { ...entries[name]!, values: values.channels[name] ?? [] };
  }
  return { version, time: { unit: v.timeUnit, values: values.time }, channels };
}

/** What run entry reads back from `GET /api/runs/:id`. */
export type StoredDraft = Pick<RunRecord, 'projectId' | 'title' | 'process' | 'runDate' | 'gasId' | 'apparatusId' | 'setup' | 'readings'>;

/** Fills the form and a new sheet from a stored draft; readings shown back in their entered units. */
export function loadDraft(form: RunForm, draft: StoredDraft, gases: readonly Gas[]): ReadingsSheet {
  const setup = draft.setup;
  const gas = setup.gas;
  const amount = setup.amount;
  const speciesId = gas?.model === 'species' ? gases.find((g) => g.code === gas.species)?.id : undefined;
  const timeUnit: TimeUnit = setup.time?.unit && setup.time.unit !== 'iso' ? setup.time.unit : 's';
  form.reset();
  form.patchValue({
    projectId: draft.projectId,
    title: draft.title,
    process: draft.process,
    runDate: draft.runDate,
    processIndex: setup.processIndex ?? null,
    gasModel: gas?.model ?? (draft.gasId !== null || draft.process !== 'calorimetric' ? 'species' : 'calorimeter'),
    gasId: draft.gasId ?? speciesId ?? null,
    degreesOfFreedom: gas?.model === 'equipartition' ? gas.f : null,
    amountFrom: amount?.from ?? 'moles',
    moles: amount?.from === 'moles' ? amount.value : null,
    molesU: amount?.from === 'moles' ? (amount.u ?? null) : null,
    mass: amount?.from === 'mass' ? amount.mass.value : null,
    massUnit: amount?.from === 'mass' ? amount.mass.unit : 'g',
    massU: amount?.from === 'mass' ? (amount.mass.u ?? null) : null,
    compressibility: amount?.from === 'initialState' ? (amount.Z ?? null) : null,
    standardization: standardizationFromSetup(setup),
    apparatusId: draft.apparatusId,
    ambientPressure: setup.ambient?.pressure?.value ?? null,
    ambientPressureUnit: setup.ambient?.pressure?.unit ?? 'kPa',
    ambientPressureU: setup.ambient?.pressure?.u ?? null,
    ambientPressureInstrumentId: setup.ambient?.pressure?.instrumentId ?? null,
    ambientTemperature: setup.ambient?.temperature?.value ?? null,
    ambientTemperatureUnit: setup.ambient?.temperature?.unit ?? 'degC',
    ambientTemperatureU: setup.ambient?.temperature?.u ?? null,
    timeUnit,
  });
  const columns: Partial<Record<SheetKey, string[]>> = {
    time: draft.readings.time.map((s) => displayFromSi('time', timeUnit, s)),
  };
  for (const name of READING_CHANNELS) {
    const entry = setup.channels?.[name];
    form.controls.channels.controls[name].patchValue({
      enabled: !!entry,
      unit: entry?.unit ?? DEFAULT_UNITS[CHANNEL_KINDS[name]],
      instrumentId: entry?.instrumentId ?? null,
      reference: entry?.reference ?? 'absolute',
    });
    if (entry) {
      // Typed digits come back as typed: 3.000 stays 3.000 (not 3), which would lose the recorded decimals.
      const places = entry.decimals;
      columns[name] = (draft.readings[name] ?? []).map((si) =>
        si === null || places === undefined ? displayFromSi(CHANNEL_KINDS[name], entry.unit, si) : fromSi(CHANNEL_KINDS[name], entry.unit, si).toFixed(places));
    }
  }
  return new ReadingsSheet(Math.max(1, draft.readings.count), columns);
}
