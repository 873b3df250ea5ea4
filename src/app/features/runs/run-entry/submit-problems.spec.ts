import { problemSentence } from './submit-problems';

describe('problemSentence', () => {
  it.each([
    [{ field: 'ambient.pressure', message: 'is required because readings.pressure.reference is "gauge"' }, 'The ambient pressure is required because readings.pressure.reference is "gauge".'],
    [{ field: 'readings.volume', message: 'is required for a isothermal run (volume or displacement readings)' }, 'The volume column is required for a isothermal run (volume or displacement readings).'],
    [{ field: 'readings.pressure[1]', message: 'must be a finite number, got null' }, 'Reading 2 of the pressure column must be a finite number, got null.'],
    [{ field: 'readings.time.values', message: 'needs at least 2 readings, got 0' }, 'The time column needs at least 2 readings, got 0.'],
    [{ field: 'readings.voltage', message: 'is required' }, 'The heater voltage column is required.'],
    [{ field: 'apparatus.heatCapacity', message: 'is required for gas.model "calorimeter" (ΔU = C·ΔT)' }, 'The apparatus heat capacity is required for gas.model "calorimeter" (ΔU = C·ΔT).'],
    [{ field: 'gas', message: 'Choose the gas, or an apparatus with a measured heat capacity for a calorimeter run.' }, 'Choose the gas, or an apparatus with a measured heat capacity for a calorimeter run.'],
  ])('turns %j into a sentence', (problem, sentence) => {
    expect(problemSentence(problem)).toBe(sentence);
  });
});
