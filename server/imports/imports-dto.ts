import { ArrayMaxSize, ArrayMinSize, IsArray, IsObject, IsString, Length, MaxLength } from 'class-validator';
import { badRequest, type FieldError } from '../core/problem';
import { validateBody } from '../core/validate-body';
import { CreateRunDto } from '../runs/runs-dto';
import { channelNames } from '../runs/run-setup';
import { setupProblems } from '../runs/setup-validation';
import type { CsvOptions, Delimiter } from './csv-reader';
import { shortText, type ImportMapping } from './row-validation';
import { isRecordId } from '../core/route-params';

/** Longest column header a saved map keeps (a logger's header is a few words; the map is listed to everyone). */
export const MAX_HEADER_LENGTH = 500;

/** POST /api/imports/column-maps: a saved column map ("logger profile") made from one file's headers. */
export class ColumnMapDto {
  @IsString({ message: 'name must be text' }) @Length(2, 120, { message: 'name must be 2 to 120 characters' })
  name!: string;

  @IsArray({ message: 'headers must be the list of column headers' }) @ArrayMinSize(1) @ArrayMaxSize(500)
  @IsString({ each: true, message: 'each header must be text' })
  @MaxLength(MAX_HEADER_LENGTH, { each: true, message: `each header must be at most ${MAX_HEADER_LENGTH} characters` })
  headers!: string[];

  @IsObject({ message: 'mapping must be { time: { index, unit }, columns: [...] }' })
  mapping!: Record<string, unknown>;
}

export type CommitTarget = { newRun: CreateRunDto } | { runId: number; version: number };

export interface CommitBody {
  mapping: ImportMapping;
  target: CommitTarget;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isIndex = (v: unknown) => Number.isInteger(v) && (v as number) >= 0;

/** An id column's range (PostgreSQL integer): a larger number names no record. */
const isId = isRecordId;

/** Checks the shape of a mapping; what it means for the file is checked against the file (checkMapping). */
export function parseMapping(value: unknown, prefix = 'mapping'): ImportMapping {
  const errors: FieldError[] = [];
  if (!isObject(value)) throw badRequest(`${prefix} must be { time: { index, unit }, columns: [{ index, channel, unit, reference?, instrumentId? }] }.`, [{ field: prefix, message: 'missing or not an object' }]);
  // A mapping is kept (the import's record, a saved map the whole lab lists): nothing else rides along in it.
  const unknown = (obj: Record<string, unknown>, known: readonly string[], at: string) => {
    const extra = Object.keys(obj).filter((key) => !known.includes(key));
    if (extra.length) errors.push({ field: at, message: `unknown field(s) ${extra.map(shortText).join(', ')} in ${at}` });
  };
  unknown(value, ['time', 'columns'], prefix);
  const time = value['time'];
  if (!isObject(time) || !isIndex(time['index']) || typeof time['unit'] !== 'string') {
    errors.push({ field: `${prefix}.time`, message: 'time must be { index: column number from 0, unit: "ms" | "s" | "min" | "h" | "iso" }' });
  } else unknown(time, ['index', 'unit'], `${prefix}.time`);
  const columns = value['columns'];
  if (!Array.isArray(columns)) errors.push({ field: `${prefix}.columns`, message: 'columns must be a list of { index, channel, unit, reference?, instrumentId? }' });
  else if (columns.length > channelNames.length) {
    errors.push({ field: `${prefix}.columns`, message: `a run has ${channelNames.length} channels; map at most ${channelNames.length} columns (${columns.length} were sent)` });
  } else {
    columns.forEach((c, k) => {
      const at = `${prefix}.columns[${k}]`;
      if (!isObject(c) || !isIndex(c['index']) || typeof c['channel'] !== 'string' || typeof c['unit'] !== 'string') {
        errors.push({ field: at, message: `${at} must be { index: column number from 0, channel, unit }` });
        return;
      }
      if (c['instrumentId'] !== undefined && !isId(c['instrumentId'])) errors.push({ field: `${at}.instrumentId`, message: 'instrumentId must be the id of a register instrument' });
      unknown(c, ['index', 'channel', 'unit', 'reference', 'instrumentId'], at);
    });
  }
  if (errors.length) throw badRequest(errors.map((e) => e.message).join('; '), errors);
  return value as unknown as ImportMapping;
}

/** What a new draft may carry besides its readings: the gas model, the amount of gas and the ambient conditions. */
export const IMPORT_SETUP_KEYS = ['gas', 'amount', 'ambient'] as const;

/** The setup of an import's new draft: the readings' time and channels come from the file, the rest from these keys. */
function checkImportSetup(setup: unknown): void {
  if (setup === undefined) return;
  if (!isObject(setup)) throw badRequest('target.newRun.setup must be an object { gas?, amount?, ambient? }.', [{ field: 'target.newRun.setup', message: 'must be an object' }]);
  const extra = Object.keys(setup).filter((k) => !(IMPORT_SETUP_KEYS as readonly string[]).includes(k));
  if (extra.length) {
    throw badRequest(`target.newRun.setup takes ${IMPORT_SETUP_KEYS.join(', ')}; the time and channels come from the file.`,
      extra.map((k) => ({ field: `target.newRun.setup.${k}`, message: 'not taken on import' })));
  }
  const errors = setupProblems(setup).map((e) => ({ ...e, field: `target.newRun.${e.field}` }));
  if (errors.length) throw badRequest(`The new draft's setup has ${errors.length} problem(s): ${errors.slice(0, 3).map((e) => e.message).join('; ')}.`, errors);
}

/** POST /api/imports/:id/check takes { mapping } and nothing else. */
export function parseCheckBody(body: unknown): ImportMapping {
  if (!isObject(body)) throw badRequest('The request body must be a JSON object { mapping }.');
  const extra = Object.keys(body).filter((k) => k !== 'mapping');
  if (extra.length) throw badRequest(`Unknown field(s) ${extra.map(shortText).join(', ')}; send { mapping }.`, extra.map((field) => ({ field, message: 'unknown field' })));
  return parseMapping(body['mapping']);
}

export async function parseCommitBody(body: unknown): Promise<CommitBody> {
  if (!isObject(body)) throw badRequest('The request body must be a JSON object { mapping, target }.');
  const extra = Object.keys(body).filter((k) => k !== 'mapping' && k !== 'target');
  if (extra.length) throw badRequest(`Unknown field(s) ${extra.join(', ')}; send { mapping, target }.`, extra.map((field) => ({ field, message: 'unknown field' })));
  const mapping = parseMapping(body['mapping']);
  const target = body['target'];
  if (isObject(target) && isObject(target['newRun']) && Object.keys(target).length === 1) {
    checkImportSetup(target['newRun']['setup']);
    return { mapping, target: { newRun: await validateBody(CreateRunDto, target['newRun']) } };
  }
  if (isObject(target) && isId(target['runId']) && isId(target['version']) && Object.keys(target).length === 2) {
    return { mapping, target: { runId: target['runId'] as number, version: target['version'] as number } };
  }
  throw badRequest('target must be { newRun: { projectId, title, process, runDate, gasId?, apparatusId?, setup?: { gas?, amount?, ambient? } } } or { runId, version } of one of your drafts.', [
    { field: 'target', message: 'either newRun or runId with version' },
  ]);
}

/** The optional form fields that come with the file. */
export function parseUploadOptions(fields: Record<string, unknown>): CsvOptions & { sheet?: string } {
  const errors: FieldError[] = [];
  const text = (k: string) => (typeof fields[k] === 'string' && fields[k] !== '' ? (fields[k] as string) : undefined);
  const delimiterRaw = text('delimiter');
  const delimiter = delimiterRaw === 'tab' || delimiterRaw === '\\t' ? '\t' : delimiterRaw;
  if (delimiter !== undefined && ![',', ';', '\t'].includes(delimiter)) errors.push({ field: 'delimiter', message: 'delimiter is ",", ";" or a tab' });
  const decimal = text('decimal');
  if (decimal !== undefined && decimal !== '.' && decimal !== ',') errors.push({ field: 'decimal', message: 'decimal is "." or ","' });
  const sheet = text('sheet');
  if (sheet !== undefined && sheet.length > 200) errors.push({ field: 'sheet', message: 'sheet is the name of a worksheet' });
  const extra = Object.keys(fields).filter((k) => !['delimiter', 'decimal', 'sheet'].includes(k));
  if (extra.length) errors.push(...extra.map((field) => ({ field, message: 'unknown field; the upload takes file, delimiter, decimal and sheet' })));
  if (errors.length) throw badRequest(errors.map((e) => e.message).join('; '), errors);
  return { delimiter: delimiter as Delimiter | undefined, decimal: decimal as '.' | ',' | undefined, sheet };
}
