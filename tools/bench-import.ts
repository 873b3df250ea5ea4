// Spreadsheet-import benchmark: a 100 000-row .xlsx and the same rows as CSV, each parsed, previewed and
// converted for commit in a fresh process, with wall time and peak RSS (target here: < 10 s, < 400 MB each).
//   npx tsx --tsconfig tsconfig.server.json tools/bench-import.ts [rows]
import { execFileSync } from 'node:child_process';
import { createWriteStream, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import ExcelJS from 'exceljs';
import { readCsv } from '../server/imports/csv-reader';
import { detectKind } from '../server/imports/file-kind';
import { importLimitsFromEnv } from '../server/imports/import-limits';
import { buildPreview, guessedMapping, guessColumns } from '../server/imports/import-preview';
import { checkRows } from '../server/imports/row-validation';
import { buildTable } from '../server/imports/table-builder';
import { readXlsx } from '../server/imports/xlsx-reader';
import { readingsToRows } from '../server/runs/run-document-mapper';
import { exitWithUsageOnHelp } from './cli-help';

exitWithUsageOnHelp(__filename);

const HEADER = ['Time (s)', 'P (kPa)', 'Piston position [mm]', 'T/°C', 'U/V', 'Heater current (mA)'];

/** Invented, smooth logger data: an isothermal expansion sampled every 0.1 s. */
function row(i: number): number[] {
  const t = i / 10;
  const x = 50 + 150 * (1 - Math.exp(-t / 3000));
  return [t, +(100 * 50 / x).toFixed(4), +x.toFixed(3), +(26.85 + 0.05 * Math.sin(t / 60)).toFixed(3), 12.0, +(250 + 0.5 * Math.sin(t / 30)).toFixed(2)];
}

async function writeFiles(dir: string, rows: number) {
  const xlsx = join(dir, 'bench.xlsx');
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: xlsx, useSharedStrings: false, useStyles: false });
  const ws = wb.addWorksheet('Logger');
  ws.addRow(HEADER).commit();
  for (let i = 0; i < rows; i++) ws.addRow(row(i)).commit();
  await wb.commit();
  const csv = join(dir, 'bench.csv');
  const out = createWriteStream(csv);
  out.write(HEADER.join(',') + '\n');
  for (let i = 0; i < rows; i++) if (!out.write(row(i).join(',') + '\n')) await new Promise<void>((r) => out.once('drain', () => r()));
  await new Promise<void>((r) => out.end(() => r()));
  return { xlsx, csv };
}

/** One format in this process: parse, preview, the commit's row check and SI conversion; prints one JSON line. */
async function measure(file: string) {
  const started = performance.now();
  const limits = importLimitsFromEnv();
  const buf = readFileSync(file);
  const name = file.split('/').pop()!;
  const kind = detectKind(name, buf);
  const raw = kind === 'xlsx' ? await readXlsx(buf, name, limits) : readCsv(buf, name, limits);
  const table = buildTable(raw, kind, name, limits);
  const parsedMs = performance.now() - started;
  const stored = JSON.stringify(table); // what imports.parsed receives
  const preview = buildPreview(table, { importId: 1, filename: name, sha256: '0'.repeat(64) });
  const previewMs = performance.now() - started;
  const mapping = guessedMapping(guessColumns(table))!;
  const check = checkRows(table, mapping);
  const { rows } = readingsToRows(check.input);
  const totalMs = performance.now() - started;
  console.log(JSON.stringify({
    format: kind, bytes: buf.length, rows: rows.length, errors: preview.errorCount + check.errorCount, storedJsonMB: +(stored.length / 1e6).toFixed(1),
    parseS: +(parsedMs / 1000).toFixed(2), previewS: +(previewMs / 1000).toFixed(2), totalS: +(totalMs / 1000).toFixed(2),
    peakRssMB: Math.round(process.resourceUsage().maxRSS / 1024),
  }));
}

async function main() {
  if (process.argv[2] === '--one') return measure(process.argv[3]);
  const rows = Number(process.argv[2] ?? 100_000);
  const dir = mkdtempSync(join(tmpdir(), 'qwell-bench-import-'));
  try {
    const files = await writeFiles(dir, rows);
    console.log(`${rows} rows: .xlsx ${(statSync(files.xlsx).size / 1e6).toFixed(1)} MB, .csv ${(statSync(files.csv).size / 1e6).toFixed(1)} MB`);
    const tsx = resolve(__dirname, '../node_modules/.bin/tsx');
    for (const file of [files.xlsx, files.csv]) {
      const line = execFileSync(tsx, ['--tsconfig', resolve(__dirname, '../tsconfig.server.json'), __filename, '--one', file], { encoding: 'utf8' }).trim();
      const r = JSON.parse(line.split('\n').pop()!);
      const ok = r.totalS < 10 && r.peakRssMB < 400 ? 'within target' : 'OVER TARGET';
      console.log(`${r.format.padEnd(4)}  rows ${r.rows}  parse ${r.parseS} s  preview ${r.previewS} s  parse+preview+commit conversion ${r.totalS} s  peak RSS ${r.peakRssMB} MB  (${ok}; row errors ${r.errors}, stored table ${r.storedJsonMB} MB)`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
