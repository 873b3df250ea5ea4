// The audit trail in the lab's words: actions as plain phrases, records by their codes, and before/after
// as a field-by-field difference. Pure: the names and codes are looked up by audit-names.ts.

/** One term for the kind of record an event touched, shown as "record type" everywhere. */
export const RECORD_TYPE_LABELS: Readonly<Record<string, string>> = {
  run: 'Run', signature: 'Signature', instrument: 'Instrument', apparatus: 'Apparatus', person: 'Person',
  project: 'Project', import: 'Import', 'column-map': 'Column map', audit: 'Audit trail', lab: 'Lab', standardization: 'Standardization',
};

/** What happened, as a short phrase a person reads aloud. */
export const ACTION_LABELS: Readonly<Record<string, string>> = {
  'run.create': 'Created the run',
  'run.update': 'Changed the run',
  'run.readings-replace': 'Replaced the readings',
  'run.submit': 'Submitted for review',
  'run.checked': 'Checked the energy balance',
  'run.check-failed': 'Could not check the balance',
  'run.approve': 'Approved',
  'run.return': 'Returned for correction',
  'run.reject': 'Rejected',
  'run.revise': 'Started a correction (new revision)',
  'run.export': 'Downloaded the run document',
  'run.report': 'Printed the run report',
  'signature.create': 'Signed',
  'signature.refused': 'Signature refused',
  'auth.sign-in': 'Signed in',
  'auth.sign-out': 'Signed out',
  'auth.sign-in-failed': 'Sign-in failed',
  'auth.sign-in-refused': 'Sign-in refused',
  'auth.account-locked': 'Account locked after failed sign-ins',
  'instrument.create': 'Added the instrument',
  'instrument.update': 'Changed the instrument',
  'calibration.create': 'Added a calibration',
  'apparatus.create': 'Added the apparatus',
  'apparatus.update': 'Changed the apparatus',
  'apparatus.change': 'Recorded a change to the apparatus (standardization due)',
  'standardization.approve': 'Approved a standardization',
  'seed.standardization': 'Loaded a demo standardization',
  'person.create': 'Added the person',
  'person.update': 'Changed the person',
  'project.create': 'Created the project',
  'project.update': 'Changed the project',
  'project.members': 'Changed the project members',
  'column-map.create': 'Saved a column map',
  'import.upload': 'Uploaded a spreadsheet',
  'import.commit': 'Imported the readings into a draft',
  'audit.export': 'Exported the audit trail',
  'mail.calibration-due': 'Mailed a calibration reminder',
  'seed.demo-lab': 'Loaded the demo lab',
  'seed.run': 'Loaded a demo run',
};

/** Sign-in and sign-out events, which the trail can leave out. */
export const SIGN_IN_ACTIONS = ['auth.sign-in', 'auth.sign-out', 'auth.sign-in-failed', 'auth.sign-in-refused', 'auth.account-locked'] as const;

export function actionLabel(action: string): string {
  return ACTION_LABELS[action] ?? action.replace(/[.-]/g, ' ').replace(/^\w/, (c) => c.toUpperCase());
}

export function recordTypeLabel(entityType: string): string {
  return RECORD_TYPE_LABELS[entityType] ?? entityType;
}

/** Words for stored values that are codes: run states, roles and verdicts. */
const VALUE_WORDS: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  state: { draft: 'Draft', submitted: 'Submitted', approved: 'Approved', returned: 'Returned', rejected: 'Rejected' },
  role: { technician: 'Technician', assistant: 'Student assistant', investigator: 'Principal investigator', quality: 'Quality officer', admin: 'Administrator' },
  verdict: { closes: 'Closes', breaks: 'Breaks', indeterminate: 'Indeterminate' },
  active: { true: 'active', false: 'deactivated' },
};

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
  if (isQuantity(value)) return `${value.value} ${value.unit}${typeof value.u === 'number' ? ` (u = ${value.u})` : ''}`;
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
  if (value && typeof value === 'object' && !Array.isArray(value) && !isQuantity(value) && depth < 3) {
    for (const [key, inner] of Object.entries(value as Record<string, unknown>)) flatten(inner, prefix ? `${prefix}.${key}` : key, out, depth + 1);
  } else if (prefix) {
    out.set(prefix, value);
  }
}

/**
 * Before and after as the fields that differ, in the order they first appear; a field present on one
 * side only shows "—" on the other. A side that is not an object (rare) is shown as one "value" field.
 */
export function fieldChanges(before: unknown, after: unknown): FieldChange[] {
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
    changes.push({
      field: fieldLabel(path),
      before: b.has(path) && before !== null && before !== undefined ? valueText(path, was) : null,
      after: a.has(path) && after !== null && after !== undefined ? valueText(path, is) : null,
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

/** The event as one sentence for exports: "Lena Okonkwo · Submitted for review · Run R-2026-0007: state: Draft → Submitted". */
export function readableLine(e: ReadableEvent, actorEmail: string | null): string {
  const who = e.actorName ?? actorEmail ?? 'Qwell (system)';
  const what = `${e.recordType} ${e.record}`.trim();
  const changed = changesText(e.changes);
  return `${who} · ${e.actionLabel} · ${what}${changed ? `: ${changed}` : ''}`;
}
