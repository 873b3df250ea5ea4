import { actionLabel, changesText, fieldChanges, readableLine, recordTypeLabel } from './audit-readable';

describe('the audit trail in plain words', () => {
  it('turns before/after into the fields that differ, with state codes as their labels', () => {
    const changes = fieldChanges({ state: 'draft', version: 3, title: 'Same' }, { state: 'submitted', version: 4, title: 'Same' });
    expect(changes).toEqual([
      { field: 'state', before: 'Draft', after: 'Submitted' },
      { field: 'version', before: '3', after: '4' },
    ]);
    expect(changesText(changes)).toBe('state: Draft → Submitted; version: 3 → 4');
  });

  it('shows a field set for the first time with no before, and nested fields by their path in words', () => {
    const changes = fieldChanges(null, { role: 'quality', vessel: { ratedPressure: 1.5e6, bore: 0.02 }, active: false });
    expect(changes).toEqual([
      { field: 'role', before: null, after: 'Quality officer' },
      { field: 'vessel rated pressure', before: null, after: '1500000' },
      { field: 'vessel bore', before: null, after: '0.02' },
      { field: 'active', before: null, after: 'deactivated' },
    ]);
    expect(changesText(changes)).toBe('role: Quality officer; vessel rated pressure: 1500000; vessel bore: 0.02; active: deactivated');
  });

  it('reads a quantity with its unit and a list of instruments by their tags', () => {
    const changes = fieldChanges(null, { ambient: { pressure: { value: 101.42, unit: 'kPa', u: 0.03 } }, instruments: [{ id: 'PG-5', name: 'gauge' }, { id: 'TC-7', name: 'Pt100' }] });
    expect(changesText(changes)).toBe('ambient pressure: 101.42 kPa (u = 0.03); instruments: PG-5, TC-7');
  });

  it('reads a small object as its fields, not as JSON', () => {
    expect(changesText(fieldChanges(null, { setup: { channels: { pressure: { unit: 'kPa', reference: 'absolute' } } } })))
      .toBe('setup channels pressure: unit kPa, reference absolute');
  });

  it('reads a list of problems as its messages, not as JSON', () => {
    const changes = fieldChanges({ state: 'submitted' }, { state: 'returned', errors: [{ path: 'gas.species', message: 'Choose the gas.' }, { path: 'amount', message: 'Give the amount of gas.' }] });
    expect(changes[1]).toEqual({ field: 'errors', before: null, after: 'Choose the gas.; Give the amount of gas.' });
  });

  it('names actions and record types in words, and falls back to a readable form for new actions', () => {
    expect(actionLabel('run.submit')).toBe('Submitted for review');
    expect(actionLabel('auth.sign-in-failed')).toBe('Sign-in failed');
    expect(actionLabel('widget.re-calibrate')).toBe('Widget re calibrate');
    expect(recordTypeLabel('column-map')).toBe('Column map');
  });

  it('makes one line for the exports\' readable column', () => {
    const line = readableLine({ actorName: 'Lena Okonkwo', actionLabel: 'Submitted for review', recordType: 'Run', record: 'R-2026-0007 rev. 1', changes: fieldChanges({ state: 'draft' }, { state: 'submitted' }) }, 'technician@lab.test');
    expect(line).toBe('Lena Okonkwo · Submitted for review · Run R-2026-0007 rev. 1: state: Draft → Submitted');
    expect(readableLine({ actorName: null, actionLabel: 'Checked the energy balance', recordType: 'Run', record: '#3', changes: [] }, null))
      .toBe('Qwell (system) · Checked the energy balance · Run #3');
  });
});
