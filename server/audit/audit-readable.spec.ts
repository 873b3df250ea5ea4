import { auditActionLabel } from '../../contract/audit';
import { changesText, fieldChanges, readableLine, recordTypeLabel } from './audit-readable';

describe('the audit trail in plain words', () => {
  it('turns before/after into the fields that differ, with state codes as their labels', () => {
    const changes = fieldChanges({ state: 'draft', version: 3, title: 'Same' }, { state: 'submitted', version: 4, title: 'Same' });
    expect(changes).toEqual([
      { field: 'State', before: 'Draft', after: 'Submitted' },
      { field: 'Version', before: '3', after: '4' },
    ]);
    expect(changesText(changes)).toBe('State: Draft → Submitted; Version: 3 → 4');
  });

  it('shows a field set for the first time with no before, and nested fields by their path in words', () => {
    const changes = fieldChanges(null, { role: 'quality', vessel: { ratedPressure: 1.5e6, bore: 0.02 }, active: false });
    expect(changes).toEqual([
      { field: 'Role', before: null, after: 'Quality officer' },
      { field: 'Vessel rated pressure', before: null, after: '1500000' },
      { field: 'Vessel bore', before: null, after: '0.02' },
      { field: 'Active', before: null, after: 'deactivated' },
    ]);
    expect(changesText(changes)).toBe('Role: Quality officer; Vessel rated pressure: 1500000; Vessel bore: 0.02; Active: deactivated');
  });

  it('reads a quantity with its unit and a list of instruments by their tags', () => {
    const changes = fieldChanges(null, { ambient: { pressure: { value: 101.42, unit: 'kPa', u: 0.03 } }, instruments: [{ id: 'PG-5', name: 'gauge' }, { id: 'TC-7', name: 'Pt100' }] });
    expect(changesText(changes)).toBe('Ambient pressure: 101.42 kPa (u = 0.03); Instruments: PG-5, TC-7');
  });

  it('names a channel\'s fields as the entry form does, with units as people write them', () => {
    expect(changesText(fieldChanges({ setup: { channels: { temperature: { unit: 'K' } } } }, { setup: { channels: { temperature: { unit: 'degC' }, pressure: { unit: 'kPa', reference: 'gauge' } } } })))
      .toBe('Temperature channel unit: K → °C; Pressure channel unit: kPa; Pressure channel reference: gauge (above the barometric pressure)');
    expect(changesText(fieldChanges(null, { setup: { ambient: { temperature: { value: 21.5, unit: 'degC' } }, apparatus: { vesselVolume: { value: 1.5, unit: 'm3' } } } })))
      .toBe('Ambient temperature: 21.5 °C; Apparatus vessel volume: 1.5 m³');
  });

  it('shows the code of a record an id field names, from the names the caller looked up', () => {
    const refs = { gasId: new Map([[3, 'N2'], [5, 'CO2']]), instrumentId: new Map([[7, 'PG-2']]) };
    expect(changesText(fieldChanges({ gasId: 3 }, { gasId: 5, setup: { channels: { pressure: { instrumentId: 7 } } } }, refs)))
      .toBe('Gas: N2 → CO2; Pressure channel instrument: PG-2');
    expect(changesText(fieldChanges({ gasId: 3 }, { gasId: 9 }, refs))).toBe('Gas: N2 → 9');
    const people = new Map([[4, 'Lena Okonkwo'], [6, 'Mateo Brandt']]);
    expect(changesText(fieldChanges({ members: [4], authorId: 4 }, { members: [4, 6], authorId: 6 }, { members: people, authorId: people })))
      .toBe('Members: Lena Okonkwo → Lena Okonkwo, Mateo Brandt; Author: Lena Okonkwo → Mateo Brandt');
  });

  it('reads a list of problems as its messages, not as JSON', () => {
    const changes = fieldChanges({ state: 'submitted' }, { state: 'returned', errors: [{ path: 'gas.species', message: 'Choose the gas.' }, { path: 'amount', message: 'Give the amount of gas.' }] });
    expect(changes[1]).toEqual({ field: 'Problems', before: null, after: 'Choose the gas.; Give the amount of gas.' });
  });

  it('names actions and record types in words, and falls back to a readable form for new actions', () => {
    // The contract's table: the run page's history reads the same words (run-history.spec.ts).
    expect(auditActionLabel('run.submit')).toBe('Submitted the run for review');
    expect(auditActionLabel('run.update')).toBe('Changed the run');
    expect(auditActionLabel('auth.sign-in-failed')).toBe('Sign-in failed');
    expect(auditActionLabel('widget.re-calibrate')).toBe('Widget re calibrate');
    expect(recordTypeLabel('column-map')).toBe('Column map');
  });

  it('makes one line for the exports\' readable column', () => {
    const line = readableLine({ actorName: 'Lena Okonkwo', actionLabel: 'Submitted the run for review', recordType: 'Run', record: 'R-2026-0007 rev. 1', changes: fieldChanges({ state: 'draft' }, { state: 'submitted' }) }, 'technician@lab.test');
    expect(line).toBe('Lena Okonkwo · Submitted the run for review · Run R-2026-0007 rev. 1: State: Draft → Submitted');
    expect(readableLine({ actorName: null, actionLabel: 'Checked the energy balance', recordType: 'Run', record: '#3', changes: [] }, null))
      .toBe('Qwell (system) · Checked the energy balance · Run #3');
  });
});
