import { safeFilename } from './safe-filename';

describe('safeFilename (OWASP ASVS V12.3.1: user-supplied file names never act as paths)', () => {
  it.each([
    ['../../etc/passwd.csv', 'passwd.csv'],
    ['..\\..\\windows\\win.ini', 'win.ini'],
    ['/abs/path/logger.xlsx', 'logger.xlsx'],
    ['run\r\nX-Injected: 1.csv', 'runX-Injected: 1.csv'],
    ['..', 'upload'],
    ['', 'upload'],
    ['logger 7 (kPa).csv', 'logger 7 (kPa).csv'],
    ['Messung_März_°C.csv', 'Messung_März_°C.csv'],
    ['Ma\u0308rz.csv', 'März.csv'],
    ['invoice\u202Egpj.csv', 'invoicegpj.csv'],
    ['zero\u200Bwidth\u0085.csv', 'zerowidth.csv'],
  ])('%j is kept as %j', (input, expected) => {
    expect(safeFilename(input)).toBe(expected);
  });

  it('keeps the end of a very long name, where the extension is', () => {
    const name = `${'a'.repeat(300)}.xlsx`;
    expect(safeFilename(name)).toHaveLength(200);
    expect(safeFilename(name).endsWith('.xlsx')).toBe(true);
  });
});
