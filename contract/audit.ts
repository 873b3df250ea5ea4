// The audit trail's actions in the lab's words. The server's trail, exports and run report and the
// client's run history all read this one table, so an action reads the same on every screen and paper.

/** What happened, as a short sentence a person reads aloud; one wording per stored action code. */
export const AUDIT_ACTION_LABELS = {
  'run.create': 'Created the run',
  'run.update': 'Changed the run',
  'run.readings-replace': 'Replaced the readings',
  'run.submit': 'Submitted the run for review',
  'run.checked': 'Checked the energy balance',
  'run.check-failed': 'Could not check the energy balance',
  'run.approve': 'Approved the run with a signature',
  'run.return': 'Returned the run for correction with a signature',
  'run.reject': 'Rejected the run with a signature',
  'run.revise': 'Started a correction as a new revision',
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
  'upload.purge': 'Deleted spreadsheets never imported, past their keeping period',
  'audit.export': 'Exported the audit trail',
  'mail.calibration-due': 'Mailed a calibration reminder',
  'seed.demo-lab': 'Loaded the demo lab',
  'seed.run': 'Loaded the run with the demo lab',
  'drill.end': 'Finished an audit trail drill',
} as const satisfies Readonly<Record<string, string>>;

/** An action code the trail stores. The server writes only these, so each one has its words. */
export type AuditAction = keyof typeof AUDIT_ACTION_LABELS;

/** Sign-in and sign-out events, which the trail can leave out. */
export const SIGN_IN_ACTIONS = ['auth.sign-in', 'auth.sign-out', 'auth.sign-in-failed', 'auth.sign-in-refused', 'auth.account-locked'] as const satisfies readonly AuditAction[];

/** The action's words; a code stored by an older release reads as its parts ("widget.re-calibrate" → "Widget re calibrate"). */
export function auditActionLabel(action: string): string {
  return (AUDIT_ACTION_LABELS as Readonly<Record<string, string>>)[action] ?? action.replace(/[.-]/g, ' ').replace(/^\w/, (c) => c.toUpperCase());
}
