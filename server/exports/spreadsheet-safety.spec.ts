import { csvField, csvRecord, neutraliseCell } from './spreadsheet-safety';

// OWASP, "CSV Injection": cells beginning with =, +, -, @, tab (0x09) or carriage return (0x0D) are
// prefixed with a single quote so that spreadsheet programs show them as text.
describe('neutraliseCell', () => {
  it.each([
    ['=HYPERLINK("http://x")', '\'=HYPERLINK("http://x")'],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(1)', "'@SUM(1)"],
    ['\t=1', "'\t=1"],
    ['\r=1', "'\r=1"],
  ])('prefixes %j', (input, expected) => {
    expect(neutraliseCell(input)).toBe(expected);
  });

  it('leaves ordinary text alone, including a sign later in the text', () => {
    expect(neutraliseCell('Barometer reading added = 101.3 kPa')).toBe('Barometer reading added = 101.3 kPa');
    expect(neutraliseCell('{"n":-5}')).toBe('{"n":-5}');
    expect(neutraliseCell('')).toBe('');
  });
});

describe('CSV fields (RFC 4180)', () => {
  it('keeps numbers as numbers, even negative ones, and leaves empty cells empty', () => {
    expect(csvField(-2.5)).toBe('-2.5');
    expect(csvField(42)).toBe('42');
    expect(csvField(null)).toBe('');
  });

  it('quotes every text field, doubling the quotes', () => {
    expect(csvField('plain')).toBe('"plain"');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\r\nlines')).toBe('"two\r\nlines"');
  });

  it('neutralises before quoting, and ends each record with CRLF', () => {
    expect(csvField('=1,2')).toBe('"\'=1,2"');
    expect(csvRecord([1, '@x', 'ok'])).toBe('1,"\'@x","ok"\r\n');
  });
});

// OWASP, "CSV Injection": a spreadsheet opened with ";" (or tab) as its list separator splits a field
// there, and one that ignores quotes splits at a quote too; a formula may then start a new cell.
describe('CSV text split at another separator', () => {
  it('neutralises the e-mail typed at sign-in that became a formula cell with ";" as separator', () => {
    const typed = "a;=cmd|' /C calc'!A0;";
    const field = csvField(typed);
    expect(field).toBe(`"a;'=cmd|' /C calc'!A0;"`);
    // Split the way a ";"-separated reader that ignores the quotes would: no piece starts a formula.
    for (const piece of field.split(';')) expect(piece.replace(/^"+/, '')).not.toMatch(/^[=+\-@\t\r]/);
  });

  it.each([
    ['x";=1+2', 'x"";\'=1+2'],
    ['a,@SUM(1)', "a,'@SUM(1)"],
    ['a\t-cmd', "a\t'-cmd"],
    ['a; +HYPERLINK(1)', "a; '+HYPERLINK(1)"],
  ])('neutralises a formula after a separator or quote in %j', (input, inner) => {
    expect(csvField(input)).toBe(`"${inner}"`);
  });

  it('leaves numbers after a separator alone, so JSON keeps its negative values', () => {
    expect(csvField('[1,-2,+3.5e-2]')).toBe('"[1,-2,+3.5e-2]"');
    expect(csvField('{"n":-5}')).toBe('"{""n"":-5}"');
  });
});
