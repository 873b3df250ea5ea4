import { inputProblems } from '../core/input-hygiene';
import { HttpProblem } from '../core/problem';
import { ReadingsJsonParser, type ColumnAt } from './readings-json-parser';

const noColumns: ColumnAt = () => null;
const valuesColumns: ColumnAt = (path) => (path[path.length - 1] === 'values' ? path.slice(0, -1).join('.') : null);

/** Parses text fed in pieces of `size` bytes (1 splits every token at every byte). */
function parse(text: string | Buffer, size = 1 << 16, columnAt = noColumns) {
  const bytes = Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8');
  const parser = new ReadingsJsonParser(columnAt);
  for (let i = 0; i < bytes.length; i += size) parser.write(bytes.subarray(i, i + size));
  return parser.end();
}

const refusal = (fn: () => unknown): HttpProblem => {
  try {
    fn();
  } catch (err) {
    if (err instanceof HttpProblem) return err;
    throw err;
  }
  throw new Error('not refused');
};

describe('ReadingsJsonParser reads JSON as JSON.parse does (JSON.parse is the reference)', () => {
  const texts = [
    '{"version":3,"time":{"unit":"s","values":[0,0.5,1e3,-2.5E-3]},"channels":{}}',
    '{"a":"caf\\u00e9 \\"quoted\\" \\\\ \\/ \\n\\r\\t","b":"Messung März °C ✓ 𝄞","c":[true,false,null,[],{}],"d":{"e":{"f":[[1],[2,[3]]]}}}',
    '[1,-0,0,-0.0,0.1,0.30000000000000004,5e-324,1.7976931348623157e308,123456789012345678901234567890,1e-400,1e400,-1e-7,100e-2,0.000001234]',
    ' \t\r\n{ "spaced" : [ 1 , 2 ] , "k" : "v" } \n',
    '{"dup":1,"dup":[2],"dup":{"last":true}}',
    '{}',
    '[]',
  ];

  it.each(texts.map((t) => [t]))('%s, whole and split at every byte', (text) => {
    const expected = JSON.parse(text) as unknown;
    expect(parse(text).value).toEqual(expected);
    expect(parse(text, 1).value).toEqual(expected);
    expect(parse(text, 7).value).toEqual(expected);
  });

  it('reads 30 000 numbers written every way JavaScript writes them bit for bit as Number() does, in a column', () => {
    let seed = 12345;
    const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const texts: string[] = [];
    for (let i = 0; i < 5000; i++) {
      const x = (random() - 0.5) * 10 ** Math.floor(random() * 40 - 20);
      texts.push(String(x), x.toExponential(Math.floor(random() * 17)), x.toFixed(Math.floor(random() * 12)), x.toPrecision(1 + Math.floor(random() * 20)), String(Math.round(x * 1e6)), `${Math.floor(random() * 1e9)}.${'0'.repeat(i % 9)}${Math.floor(random() * 1e6)}e${i % 45 - 22}`);
    }
    const body = `{"time":{"values":[${texts.join(',')}]}}`;
    for (const size of [1 << 16, 13]) {
      const { columns, value } = parse(body, size, valuesColumns);
      const col = columns.get('time')!;
      expect(value).toEqual({ time: { values: [] } });
      expect(col.length).toBe(texts.length);
      const expected = Float64Array.from(texts, Number);
      const mismatches = texts.filter((t, i) => !Object.is(col.nums[i], expected[i]));
      expect(mismatches).toEqual([]);
    }
  });

  it('keeps what is not a number in a column as it was sent, a null as a gap', () => {
    const { columns } = parse('{"c":{"values":[1,null,"x",true,{"k":[1]},[2],-0]}}', 3, valuesColumns);
    const col = columns.get('c')!;
    expect(col.length).toBe(7);
    expect([...col.nums].map((v) => (Number.isNaN(v) ? 'NaN' : v))).toEqual([1, 'NaN', 'NaN', 'NaN', 'NaN', 'NaN', -0]);
    expect(Object.is(col.nums[6], -0)).toBe(true);
    expect([...col.others.entries()]).toEqual([[2, 'x'], [3, true], [4, { k: [1] }], [5, [2]]]);
  });

  it('answers an empty body as express.json does ({}), and refuses a body that is no object or array, as its strict mode does', () => {
    expect(parse('').value).toEqual({});
    for (const text of ['"text"', '42', 'null', 'true']) expect(refusal(() => parse(text)).detail).toMatch(/not valid JSON/);
  });

  it.each([
    ['{"a":}'], ['{"a":01}'], ['{"a":1.}'], ['{"a":-}'], ['{"a":1e}'], ['{"a":1e+}'], ['{"a":.5}'], ['{"a":tru}'], ['{"a":nul}'],
    ['{"a":"x\u0001"}'], ['{"a":1}x'], ['{"a":1}{}'], ['{"a":1'], ['[1,]'], ['{"a" 1}'], ['{"a":1,}'], ['{"a":"\\x"}'], ['{a:1}'], ['[1}'], [' '],
  ])('refuses %s with a 400, as JSON.parse refuses it', (text) => {
    expect(() => JSON.parse(text)).toThrow();
    const problem = refusal(() => parse(text, 1));
    expect(problem.status).toBe(400);
    expect(problem.detail).toMatch(/not valid JSON|must be a JSON object/);
  });
});

describe('ReadingsJsonParser applies the input hygiene of every body while reading', () => {
  it('refuses a body nested 10 000 deep at the 33rd level, without a stack overflow', () => {
    const text = `${'['.repeat(10_000)}${']'.repeat(10_000)}`;
    const problem = refusal(() => parse(text));
    expect(problem.status).toBe(400);
    expect(problem.detail).toMatch(/nested more than 32 levels deep at \[0\]\[0\]/);
    // 32 levels are a body like any other.
    expect(parse(`${'['.repeat(32)}${']'.repeat(32)}`).value).toEqual(JSON.parse(`${'['.repeat(32)}${']'.repeat(32)}`));
  });

  it('names the same fields as inputProblems for prototype keys and control characters, also inside columns', () => {
    const text = '{"time":{"unit":"iso","values":["2026-01-01T00:00:00Z","2026-01-01T00:00:01Z\\u0000",{"__proto__":1}]},"channels":{"pressure":{"unit":"k\\u0007Pa"}},"constructor":{}}';
    const problem = refusal(() => parse(text, 5, valuesColumns));
    expect(problem.status).toBe(400);
    const fields = (problem.errors ?? []).map((e) => e.field).sort();
    expect(fields).toEqual(inputProblems(JSON.parse(text)).map((e) => e.field).sort());
    expect(fields).toEqual(['channels.pressure.unit', 'constructor', 'time.values[1]', 'time.values[2].__proto__']);
    expect(problem.detail).toMatch(/^The request body was refused: .*NUL character/);
  });
});
