// The audit trail in the lab's words: actions as plain phrases (contract/audit.ts), records by their codes, and before/after
// as a field-by-field difference. Pure: the names and codes are looked up by audit-names.ts.
import { ROLE_LABELS } from '../../contract/roles';
import { RUN_STATE_LABELS, VERDICT_LABELS } from '../../contract/runs';
import { CHANNEL_LABELS } from '../../contract/channels';
import { UNIT_SYMBOLS } from '../../contract/units';

/** One term for the kind of record an event touched, shown as "record type" everywhere. */
export const RECORD_TYPE_LABELS: Readonly<Record<string, string>> = {
  run: 'Run', signature: 'Signature', instrument: 'Instrument', apparatus: 'Apparatus', person: 'Person',
  project: 'Project', import: 'Import', 'column-map': 'Column map', audit: 'Audit trail', lab: 'Lab', standardization: 'Standardization',
  upload: 'Uploaded spreadsheet', drill: 'Audit trail drill',
};

export function recordTypeLabel(entityType: string): string {
  return RECORD_TYPE_LABELS[entityType] ?? entityType;
}

/** Words for stored values that are codes: run states, roles and verdicts. */
const VALUE_WORDS: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  state: RUN_STATE_LABELS,
  role: ROLE_LABELS,
  verdict: VERDICT_LABELS,
  active: { true: 'active', false: 'deactivated' },
  // Units as people write them (the stored codes are ASCII).
  unit: { ...UNIT_SYMBOLS, cal_th: 'cal (thermochemical)', 'cal_th/K': 'cal (thermochemical)/K', iso: 'date and time' },
  reference: { absolute: 'absolute', gauge: 'gauge (above the barometric pressure)' },
};

/** Words for the run's reading channels, as the entry form names them (the contract's headings). */
const CHANNEL_WORDS: Readonly<Record<string, string>> = CHANNEL_LABELS;

/** Fields whose path says little to a person, by their label on the screens. */
const PATH_LABELS: Readonly<Record<string, string>> = {
  gasId: 'Gas', apparatusId: 'Apparatus', projectId: 'Project', authorId: 'Author', runDate: 'Run date', returnReason: 'Reason for return',
  revisionReason: 'Reason for the correction', 'setup.processIndex': 'Polytropic index', 'setup.apparatusSource': 'Apparatus constants from',
  'setup.instruments': 'Instruments described in the run', 'setup.gas.model': 'Gas model', 'setup.gas.species': 'Gas species', 'setup.gas.realGas': 'Real-gas correction',
  'setup.gas.f': 'Degrees of freedom', 'setup.amount.from': 'Amount of gas from', 'setup.amount.value': 'Amount of gas (mol)', 'setup.amount.u': 'Amount of gas, standard uncertainty (mol)', 'setup.amount.mass': 'Mass of gas',
  'setup.time.unit': 'Time unit', 'setup.time.origin': 'Time origin', instrumentId: 'Instrument', errors: 'Problems', En: 'En',
  inputHash: 'Input SHA-256', signedHash: 'Signed SHA-256', resultId: 'Result id', runVersion: 'Run version', ratedPressureReference: 'Rated pressure is',
};

/**
 * A changed field's label as the screens say it: "setup.channels.temperature.unit" → "Temperature channel unit",
 * "gasId" → "Gas", "setup.ambient.pressure" → "Ambient pressure".
 */
export function pathLabel(path: string): string {
  if (PATH_LABELS[path]) return PATH_LABELS[path];
  const channel = /^setup\.channels\.(\w+)(?:\.(\w+))?$/.exec(path);
  if (channel) {
    const field = channel[2] === 'instrumentId' ? 'instrument' : channel[2] ? fieldLabel(channel[2]) : '';
    return `${CHANNEL_WORDS[channel[1]] ?? fieldLabel(channel[1])} channel${field ? ` ${field}` : ''}`;
  }
  return fieldLabel(path.replace(/^setup\./, '')).replace(/^\w/, (c) => c.toUpperCase());
}

/** Field names as words: `runVersion` → "run version", `ratedPressure.unit` → "rated pressure unit". */
export function fieldLabel(path: string): string {
  const words: Record<string, string> = { En: 'En', inputHash: 'input SHA-256', signedHash: 'signed SHA-256', resultId: 'result id', runId: 'run id' };
  return path.split('.').map((part) => words[part] ?? part.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()).join(' ');
}

/** A stored value as text: codes as words, numbers as they are, lists and objects compact. */
export function valueText(path: string, value: unknown): string {
  if (value === null || value === undefined) return '—';
  const last = path.split('.').pop()!;
  const words = VALUE_WORDS[last];
  if (words && words[String(value)] !== undefined) return words[String(value)];
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
  if (typeof value === 'string') return value;
  if (isQuantity(value)) return `${value.value} ${VALUE_WORDS['unit'][value.unit] ?? value.unit}${typeof value.u === 'number' ? ` (u = ${value.u})` : ''}`;
  if (Array.isArray(value)) {
    // Lists of records (a run's instruments) read as their tags.
    const tags = value.map((v) => (v && typeof v === 'object' ? ((v as Record<string, unknown>)['id'] ?? (v as Record<string, unknown>)['tag'] ?? (v as Record<string, unknown>)['code']) : undefined));
    if (value.length && tags.every((t) => typeof t === 'string')) return tags.join(', ');
    // Problem lists (e.g. a failed check's errors) read as their messages.
    const messages = value.map((v) => (v && typeof v === 'object' && 'message' in v ? String((v as { message: unknown }).message) : null));
    if (value.length && messages.every((m) => m !== null)) return messages.join('; ');
    return value.map((v) => (typeof v === 'object' ? JSON.stringify(v) : String(v))).join(', ');
  }
  // A small object reads as its fields: "unit kPa, reference absolute".
  return Object.entries(value as Record<string, unknown>).map(([k, v]) => `${fieldLabel(k)} ${typeof v === 'object' && v !== null ? JSON.stringify(v) : valueText(k, v)}`).join(', ');
}

/** Codes of the records an id field names (`gasId` → "N2", a channel's `instrumentId` → "PG-2"), by path or last key. */
export type ReferenceNames = Partial<Record<string, ReadonlyMap<number, string>>>;

/** One field that an event changed (or set, or cleared). */
export interface FieldChange {
  field: string;
  before: string | null;
  after: string | null;
}

/** A stored quantity `{ value, unit, u? }`, read as "101.42 kPa (u = 0.03)". */
function isQuantity(v: unknown): v is { value: unknown; unit: string; u?: unknown } {
  return !!v && typeof v === 'object' && !Array.isArray(v) && 'value' in v && typeof (v as { unit?: unknown }).unit === 'string';
}

function flatten(value: unknown, prefix: string, out: Map<string, unknown>, depth: number): void {
  if (value && typeof value === 'object' && !Array.isArray(value) && !isQuantity(value) && depth < 4) {
    for (const [key, inner] of Object.entries(value as Record<string, unknown>)) flatten(inner, prefix ? `${prefix}.${key}` : key, out, depth + 1);
  } else if (prefix) {
    out.set(prefix, value);
  }
}

/**
 * Before and after as the fields that differ, in the order they first appear; a field present on one
 * side only shows "—" on the other. A side that is not an object (rare) is shown as one "value" field.
 */
export function fieldChanges(before: unknown, after: unknown, refs: ReferenceNames = {}): FieldChange[] {
  const wrap = (v: unknown) => (v === null || v === undefined ? {} : typeof v === 'object' && !Array.isArray(v) ? v : { value: v });
  const b = new Map<string, unknown>();
  const a = new Map<string, unknown>();
  flatten(wrap(before), '', b, 0);
  flatten(wrap(after), '', a, 0);
  const paths = [...new Set([...b.keys(), ...a.keys()])];
  const changes: FieldChange[] = [];
  for (const path of paths) {
    const was = b.get(path);
    const is = a.get(path);
    if (JSON.stringify(was) === JSON.stringify(is)) continue;
    const names = refs[path] ?? refs[path.split('.').pop()!];
    // A list of ids (a project's members) reads as their names, each one looked up.
    const text = (v: unknown) => (names && Array.isArray(v) ? v.map((x) => names.get(Number(x)) ?? String(x)).join(', ') : names?.get(Number(v)) ?? valueText(path, v));
    changes.push({
      field: pathLabel(path),
      before: b.has(path) && before !== null && before !== undefined ? text(was) : null,
      after: a.has(path) && after !== null && after !== undefined ? text(is) : null,
    });
  }
  return changes;
}

/** Changes as one line: "state: Draft → Submitted; version: 3 → 4". */
export function changesText(changes: readonly FieldChange[]): string {
  return changes.map((c) => (c.before === null ? `${c.field}: ${c.after}` : c.after === null ? `${c.field}: ${c.before} (removed)` : `${c.field}: ${c.before} → ${c.after}`)).join('; ');
}

/** An event with the names and codes it needs to read well. */
export interface ReadableEvent {
  /** The person's name, or null for an event the system wrote. */
  actorName: string | null;
  actionLabel: string;
  recordType: string;
  /** The record by its code ("R-2026-0007 rev. 1", "PG-2"), or its id when it has no code. */
  record: string;
  changes: FieldChange[];
}

/** The event as one sentence for exports: "Lena Okonkwo · Submitted the run for review · Run R-2026-0007: state: Draft → Submitted". */
export function readableLine(e: ReadableEvent, actorEmail: string | null): string {
  const who = e.actorName ?? actorEmail ?? 'Qwell (system)';
  const what = `${e.recordType} ${e.record}`.trim();
  const changed = changesText(e.changes);
  return `${who} · ${e.actionLabel} · ${what}${changed ? `: ${changed}` : ''}`;
}
