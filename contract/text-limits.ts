// The longest text each free-text field takes, in characters: the server refuses longer text with a 400
// naming the field and its limit, and the client's forms stop at the same length. The database columns
// are `text` (no limit of their own), so these are the only bound.

export const TEXT_LIMITS = {
  /** A run's title, a person's, project's, instrument's or apparatus's name, a column map's name is shorter. */
  title: 200,
  name: 200,
  /** A code, tag or an instrument's id inside a run document. */
  code: 64,
  instrumentId: 100,
  /** A unit as written in a file or a certificate (kPa, degC, J/g). */
  unit: 20,
  /** A certificate's number, a serial number. */
  certificate: 100,
  /** Why a run is corrected; what was changed on an apparatus; a project's description; notes on a register entry. */
  reason: 2000,
  /** The reason that comes with a signature (a justification may quote figures). */
  signatureReason: 4000,
  /** Free notes kept with a run's setup. */
  runNotes: 10_000,
  /** An email address (RFC 5321: 254 characters). */
  email: 254,
} as const;

export type TextLimitName = keyof typeof TEXT_LIMITS;

/** "is at most 2000 characters (2314 were sent)": the end of the sentence both sides show when text is too long. */
export function tooLong(limit: number, length?: number): string {
  return `is at most ${limit} characters${length === undefined ? '' : ` (${length} were sent)`}`;
}

/** "reason is at most 2000 characters (2314 were sent)". */
export function tooLongMessage(field: string, limit: number, length?: number): string {
  return `${field} ${tooLong(limit, length)}`;
}
