import { choicesFrom, mappingFrom, withChannel } from './import-mapping';
import { SAMPLE_PREVIEW } from './import-preview-sample';

describe('column choices', () => {
  it('asks whether a pressure is absolute or gauge when the header does not say, and maps once it is said', () => {
    const columns = SAMPLE_PREVIEW.columns.map((c) => (c.index === 1 ? { ...c, header: 'P (kPa)', guess: { channel: 'pressure' as const, unit: 'kPa' } } : c));
    const choices = choicesFrom(columns);
    expect(mappingFrom(choices)).toEqual({ mapping: null, missing: ['Say whether the pressure in "P (kPa)" is absolute or gauge.'] });
    // Choosing the channel again (as the select does) starts from "absolute", the common logger default.
    const chosen = withChannel(choices, 1, 'pressure');
    expect(mappingFrom(chosen).mapping?.columns[0]).toEqual({ index: 1, channel: 'pressure', unit: 'kPa', reference: 'absolute' });
  });

  it('keeps a unit that fits the new channel and replaces one that does not', () => {
    const choices = choicesFrom(SAMPLE_PREVIEW.columns);
    expect(withChannel(choices, 2, 'temperature')[2].unit).toBe('degC');
    expect(withChannel(choices, 2, 'voltage')[2].unit).toBe('V');
  });

  it('applies a saved column map over the guesses, leaving unmapped columns out', () => {
    const choices = choicesFrom(SAMPLE_PREVIEW.columns, { time: { index: 3, unit: 'min' }, columns: [{ index: 0, channel: 'volume', unit: 'mL' }] });
    expect(mappingFrom(choices).mapping).toEqual({ time: { index: 3, unit: 'min' }, columns: [{ index: 0, channel: 'volume', unit: 'mL' }] });
  });
});
