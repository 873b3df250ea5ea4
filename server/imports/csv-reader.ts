import { parse } from 'csv-parse/sync';
import { badRequest } from '../core/problem';
import type { ImportLimits } from './import-limits';
import { unreadableFile } from './import-problems';
import { parseNumber, placesOfText, type Cell, type RawTable } from './raw-table';
import { HEADER_SEARCH_ROWS } from './xlsx-reader';

export type Delimiter = ',' | ';' | '\t';
export interface CsvOptions {
  delimiter?: Delimiter;
  decimal?: '.' | ',';
}

const DECIMAL_COMMA = /^[+-]?\d+,\d+$/;

/** Counts a character outside double quotes on each of the first lines. */
function countsPerLine(lines: string[], ch: string): number[] {
  return lines.map((line) => {
    let n = 0;
    let quoted = false;
    for (const c of line) {
      if (c === '"') quoted = !quoted;
      else if (c === ch && !quoted) n += 1;
    }
    return n;
  });
}

/** The separator the first lines use most consistently. */
function sniffDelimiter(text: string): Delimiter {
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '').slice(0, 30);
  const score = (ch: string) => {
    const counts = countsPerLine(lines, ch);
    const tail = counts.slice(Math.max(0, counts.length - 10));
    return tail.every((n) => n > 0) ? Math.min(...tail) : 0;
  };
  const scores: Array<[Delimiter, number]> = [[',', score(',')], [';', score(';')], ['\t', score('\t')]];
  scores.sort((a, b) => b[1] - a[1]);
  return scores[0][1] > 0 ? scores[0][0] : ',';
}

/**
 * Reads a CSV export. Separator and decimal mark come from the person when they say them; when they do not,
 * a file that uses ";" (usually with decimal commas) is refused with the choice to make, never guessed at.
 */
export function readCsv(buf: Buffer, filename: string, limits: ImportLimits, options: CsvOptions = {}): RawTable {
  const text = buf.toString('utf8').replace(/^\uFEFF/, '');
  const sniffed = sniffDelimiter(text);
  const decimal = options.decimal ?? '.';
  let delimiter = options.delimiter;
  if (!delimiter) {
    if (sniffed === ';' && decimal !== ',') {
      throw unreadableFile(
        `"${filename}" separates its columns with ";" (common where the decimal mark is a comma). ` +
        'Choose the separator ";" and, if numbers are written like 1,25, the decimal mark ","; then upload it again.',
      );
    }
    delimiter = sniffed;
  }
  if (delimiter === ',' && decimal === ',') {
    throw badRequest('A CSV file cannot use "," both as the separator and as the decimal mark; choose the separator ";" or a tab.', [
      { field: 'decimal', message: 'the decimal mark "," needs the separator ";" or a tab' },
    ]);
  }
  let records: string[][];
  try {
    records = parse(text, { delimiter, relax_column_count: true, relax_quotes: true, skip_empty_lines: false, trim: true, to: limits.maxRows + HEADER_SEARCH_ROWS + 1 });
  } catch (err) {
    throw unreadableFile(`"${filename}" is not readable as CSV: ${(err as Error).message}.`);
  }
  if (records.length > limits.maxRows + HEADER_SEARCH_ROWS) {
    throw unreadableFile(`"${filename}" has more than ${limits.maxRows} rows of data, the most Qwell imports at once. Split the file into smaller parts.`);
  }
  let commaDecimals = 0;
  const rows: RawTable['rows'] = [];
  records.forEach((record, i) => {
    let any = false;
    const places: Array<number | null> = [];
    const cells: Cell[] = record.map((raw, c) => {
      places[c] = null;
      if (raw === '') return null;
      any = true;
      const n = parseNumber(raw, decimal);
      if (n === null && decimal === '.' && DECIMAL_COMMA.test(raw)) commaDecimals += 1;
      // The digits as written: "3.000" keeps its three decimals, which the number 3 forgets.
      if (n !== null) places[c] = placesOfText(decimal === ',' ? raw.replace(',', '.') : raw);
      return n ?? raw;
    });
    // Line numbers as an editor shows them (quoted line breaks inside a field are not expected in logger files).
    if (any) rows.push({ n: i + 1, cells, places });
  });
  if (!options.decimal && commaDecimals > 0 && commaDecimals >= rows.length / 2) {
    throw unreadableFile(`"${filename}" writes its numbers with a decimal comma (like 1,25). Choose the decimal mark "," and upload it again.`);
  }
  const notes = options.delimiter || options.decimal
    ? [`read as CSV with separator ${delimiter === '\t' ? 'tab' : `"${delimiter}"`} and decimal mark "${decimal}"`]
    : [];
  return { sheet: null, rows, notes, merges: [] };
}
