// The run workflow's words: states, processes, verdicts, the actions a person may take and what a
// signature means. The server validates against these lists; the client offers exactly them.

/** Where a run is in its workflow. */
export const RUN_STATES = ['draft', 'submitted', 'approved', 'returned', 'rejected'] as const;
export type RunState = (typeof RUN_STATES)[number];

export const RUN_STATE_LABELS: Readonly<Record<RunState, string>> = {
  draft: 'Draft',
  submitted: 'Submitted',
  approved: 'Approved',
  returned: 'Returned',
  rejected: 'Rejected',
};

/** States in which the author may still change and submit the run. */
export const EDITABLE_STATES = ['draft', 'returned'] as const satisfies readonly RunState[];

/** Processes a run can claim; 'free-form' follows no named process (no model work, no claim flags). */
export const RUN_PROCESSES = ['isobaric', 'isochoric', 'isothermal', 'adiabatic', 'polytropic', 'calorimetric', 'free-form'] as const;
export type RunProcess = (typeof RUN_PROCESSES)[number];

/** The engine's verdict on a run's energy balance. */
export const VERDICTS = ['closes', 'breaks', 'indeterminate'] as const;
export type Verdict = (typeof VERDICTS)[number];

export const VERDICT_LABELS: Readonly<Record<Verdict, string>> = {
  closes: 'Closes',
  breaks: 'Breaks',
  indeterminate: 'Indeterminate',
};

/**
 * What a person may do to a run; `GET /api/runs/:id` lists those the signed-in person may take now
 * (`RunRead.actions`), decided by the server's workflow table.
 */
export const RUN_ACTIONS = ['edit', 'submit', 'approve', 'return', 'reject', 'correct'] as const;
export type RunAction = (typeof RUN_ACTIONS)[number];

/** The three decisions an investigator signs. */
export const REVIEW_ACTIONS = ['approve', 'return', 'reject'] as const satisfies readonly RunAction[];
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

/** A signature's decision in words, beside its meaning (the run page's history and the run report). */
export const REVIEW_DECISION_LABELS: Readonly<Record<ReviewAction, string>> = {
  approve: 'Approved',
  return: 'Returned for correction',
  reject: 'Rejected',
};

/**
 * What a run signature means, per decision: the signer chooses one of these sentences and it is
 * stored with the signature. Legally significant text: change it here, and only on purpose.
 */
export const SIGNATURE_MEANINGS: Readonly<Record<ReviewAction, readonly string[]>> = {
  approve: ['I have reviewed this run and approve its results', 'I approve this run for release from the lab'],
  return: ['I have reviewed this run and return it for correction'],
  reject: ['I have reviewed this run and reject its results'],
};

/** What a quality officer's signature on a standardization (an apparatus's energy equivalent) means. */
export const STANDARDIZATION_MEANINGS: readonly string[] = [
  'I have reviewed these standardization runs and approve the energy equivalent',
];

/** Shortest reason the server takes for returning or rejecting a run. */
export const MIN_REVIEW_REASON = 5;
/** Shortest written justification for approving a run whose check breaks or is indeterminate. */
export const MIN_JUSTIFICATION = 20;
