import { Gas } from '../../gases/gases.models';
import { ReadingsSheet } from './readings-grid/readings-sheet';
import { RunForm, createBody, createRunForm, loadDraft, readingsBody, setupOf, updateBody } from './run-entry-form';

const gases: Gas[] = [
  { id: 3, code: 'Ar', name: 'Argon', molarMass: 0.039948, model: 'monatomic' },
  { id: 1, code: 'N2', name: 'Nitrogen', molarMass: 0.0280134, model: 'shomate' },
];

function filledForm(): RunForm {
  const form = createRunForm('2026-11-30');
  form.patchValue({
    projectId: 1,
    title: '  Isothermal compression of argon ',
    process: 'isothermal',
    gasModel: 'species',
    gasId: 3,
    amountFrom: 'moles',
    moles: 0.05,
    molesU: 0.0002,
    apparatusId: 1,
    ambientTemperature: 21.5,
    ambientTemperatureU: 0.1,
  });
  form.controls.channels.controls.pressure.patchValue({ enabled: true, unit: 'kPa', instrumentId: 1 });
  form.controls.channels.controls.volume.patchValue({ enabled: true, unit: 'mL' });
  return form;
}

describe('run entry form', () => {
  it('requires project, title, process and date before the first save', () => {
    const form = createRunForm('2026-11-30');
    expect(form.controls.projectId.hasError('required')).toBe(true);
    expect(form.controls.title.hasError('required')).toBe(true);
    expect(form.controls.process.hasError('required')).toBe(true);
    expect(form.controls.runDate.valid).toBe(true);
    expect(createBody(form, gases)).toBeNull();

    form.patchValue({ projectId: 1, title: 'ab', process: 'isobaric' });
    expect(form.controls.title.hasError('minlength')).toBe(true);
    expect(createBody(form, gases)).toBeNull();
  });

  it('asks for the gas, f or the polytropic index only where they apply', () => {
    const form = filledForm();
    expect(form.errors).toBeNull();
    form.patchValue({ gasId: null });
    expect(form.hasError('gasRequired')).toBe(true);
    form.patchValue({ gasModel: 'equipartition' });
    expect(form.hasError('degreesOfFreedomRequired')).toBe(true);
    form.patchValue({ degreesOfFreedom: 5, process: 'polytropic' });
    expect(form.hasError('processIndexRequired')).toBe(true);
    form.patchValue({ processIndex: 1.3 });
    expect(form.errors).toBeNull();
  });

  it('says gauge pressure needs the ambient pressure, and is satisfied once it is given', () => {
    const form = filledForm();
    form.controls.channels.controls.pressure.controls.reference.setValue('gauge');
    expect(form.hasError('gaugeNeedsAmbient')).toBe(true);
    form.patchValue({ ambientPressure: 101.4 });
    expect(form.hasError('gaugeNeedsAmbient')).toBe(false);
  });

  it('builds the POST body with gas, amount, ambient and channels in the setup', () => {
    expect(createBody(filledForm(), gases)).toEqual({
      projectId: 1,
      title: 'Isothermal compression of argon',
      process: 'isothermal',
      runDate: '2026-11-30',
      gasId: 3,
      apparatusId: 1,
      setup: {
        time: { unit: 's' },
        gas: { model: 'species', species: 'Ar' },
        amount: { from: 'moles', value: 0.05, u: 0.0002 },
        ambient: { temperature: { value: 21.5, unit: 'degC', u: 0.1 } },
        channels: {
          pressure: { unit: 'kPa', instrumentId: 1, reference: 'absolute' },
          volume: { unit: 'mL' },
        },
      },
    });
  });

  it('builds the PATCH body at the given version, keeping setup keys the form does not own', () => {
    const form = filledForm();
    form.patchValue({ gasModel: 'calorimeter', ambientPressure: 101.4, ambientPressureUnit: 'kPa' });
    const base = { notes: 'bath refilled', apparatus: { deadVolume: { value: 2, unit: 'mL' } }, amount: { from: 'moles' as const, value: 1 } };
    const body = updateBody(7, form, gases, base);
    expect(body).toEqual({
      version: 7,
      title: 'Isothermal compression of argon',
      process: 'isothermal',
      runDate: '2026-11-30',
      gasId: null,
      apparatusId: 1,
      setup: {
        notes: 'bath refilled',
        apparatus: { deadVolume: { value: 2, unit: 'mL' } },
        time: { unit: 's' },
        gas: { model: 'calorimeter' },
        ambient: {
          pressure: { value: 101.4, unit: 'kPa' },
          temperature: { value: 21.5, unit: 'degC', u: 0.1 },
        },
        channels: {
          pressure: { unit: 'kPa', instrumentId: 1, reference: 'absolute' },
          volume: { unit: 'mL' },
        },
      },
    });
  });

  it('writes the amount from a mass or from the initial state with its optional Z', () => {
    const form = filledForm();
    form.patchValue({ amountFrom: 'mass', mass: 2.1, massUnit: 'g' });
    expect(setupOf(form.getRawValue(), gases).amount).toEqual({ from: 'mass', mass: { value: 2.1, unit: 'g' } });
    form.patchValue({ amountFrom: 'initialState', compressibility: 0.999 });
    expect(setupOf(form.getRawValue(), gases).amount).toEqual({ from: 'initialState', Z: 0.999 });
  });

  it('builds the PUT readings body from the visible columns, skipping empty rows, empty cells as null', () => {
    const form = filledForm();
    const sheet = new ReadingsSheet(4, {
      time: ['0', '10', '', '20'],
      pressure: ['101.3', '150.2', '', ''],
      volume: ['250', '', '', '125.5'],
      temperature: ['21', '22', '23', '24'],
    });
    expect(readingsBody(4, form.getRawValue(), sheet)).toEqual({
      version: 4,
      time: { unit: 's', values: [0, 10, 20] },
      channels: {
        pressure: { unit: 'kPa', instrumentId: 1, reference: 'absolute', decimals: 1, values: [101.3, 150.2, null] },
        volume: { unit: 'mL', decimals: 1, values: [250, null, 125.5] },
      },
    });
  });

  it('records the decimals each channel was typed with, so that 3.000 comes back as 3.000 and not 3', () => {
    const sheet = new ReadingsSheet(3, { time: ['0', '1', '2'], voltage: ['3.000', '3.000', '3.000'], volume: ['5e-4', '2.5E-3', ''], current: ['12', '', ''] });
    expect(sheet.decimalsOf('voltage')).toBe(3);
    expect(sheet.decimalsOf('volume')).toBe(4);
    expect(sheet.decimalsOf('current')).toBe(0);
    expect(sheet.decimalsOf('pressure')).toBeNull();
    const form = filledForm();
    expect(setupOf(form.getRawValue(), gases, {}, new ReadingsSheet(1, { pressure: ['101.300'] })).channels?.pressure?.decimals).toBe(3);
  });

  it('loads a stored draft back into the form, readings in their entered units', () => {
    const form = createRunForm('2026-12-01');
    const sheet = loadDraft(
      form,
      {
        projectId: 2,
        title: 'Bath calibration',
        process: 'isobaric',
        runDate: '2026-03-14',
        gasId: 1,
        apparatusId: null,
        setup: {
          gas: { model: 'species', species: 'N2' },
          time: { unit: 'min' },
          ambient: { pressure: { value: 1.013, unit: 'bar', u: 0.001 } },
          channels: { pressure: { unit: 'kPa', reference: 'gauge', instrumentId: 1 }, temperature: { unit: 'degC' } },
        },
        readings: {
          count: 2,
          time: [0, 90],
          pressure: [150000, 152500],
          temperature: [294.65, null],
          volume: [null, null],
          displacement: [null, null],
          voltage: [null, null],
          current: [null, null],
          power: [null, null],
        },
      },
      gases,
    );
    const v = form.getRawValue();
    expect([v.projectId, v.title, v.process, v.gasId, v.timeUnit, v.ambientPressure, v.ambientPressureUnit]).toEqual([
      2, 'Bath calibration', 'isobaric', 1, 'min', 1.013, 'bar',
    ]);
    expect(v.channels.pressure).toEqual({ enabled: true, unit: 'kPa', instrumentId: 1, reference: 'gauge' });
    expect(v.channels.volume.enabled).toBe(false);
    expect([sheet.cell(1, 'time'), sheet.cell(1, 'pressure'), sheet.cell(0, 'temperature'), sheet.cell(1, 'temperature')]).toEqual([
      '1.5', '152.5', '21.5', '',
    ]);
  });

  it('sets what the run document can: a free-form claim, time in ms, the barometer in hPa from the register (issue 12)', () => {
    const form = filledForm();
    form.patchValue({ process: 'free-form', timeUnit: 'ms', ambientPressure: 1013.2, ambientPressureUnit: 'hPa', ambientPressureInstrumentId: 9 });
    const body = createBody(form, gases)!;
    expect(body.process).toBe('free-form');
    expect(body.setup!.ambient!.pressure).toEqual({ value: 1013.2, unit: 'hPa', instrumentId: 9 });
    expect(readingsBody(1, form.getRawValue(), new ReadingsSheet(), body.setup).time.unit).toBe('ms');
  });
});
