import { addressParams, pageRangeMessage } from './paged-query';

describe('paged list helpers', () => {
  it('leaves defaults out of the address and keeps the rest', () => {
    const defaults = { page: 1, pageSize: 25, state: null as string | null };
    expect(addressParams({ page: 3, pageSize: 25, state: 'draft' }, defaults)).toEqual({ page: 3, pageSize: null, state: 'draft' });
  });

  it('announces the range shown, the last page cut to the total, or that nothing matches', () => {
    expect(pageRangeMessage({ total: 112, page: 2, pageSize: 25 }, 'Runs')).toBe('Runs 26 to 50 of 112 shown.');
    expect(pageRangeMessage({ total: 112, page: 5, pageSize: 25 }, 'Runs')).toBe('Runs 101 to 112 of 112 shown.');
    expect(pageRangeMessage({ total: 0, page: 1, pageSize: 25 }, 'Audit events')).toBe('No audit events match.');
  });
});
