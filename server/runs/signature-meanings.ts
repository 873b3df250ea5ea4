import { SIGNATURE_MEANINGS, type ReviewAction } from '../../contract/runs';

/**
 * The meanings the server accepts for a review signature: the contract's list, nothing added. Pure (no
 * Express, no database), so the client's review-dialog spec compares its options with this very rule.
 */
export function meaningsAccepted(action: ReviewAction): readonly string[] {
  return SIGNATURE_MEANINGS[action];
}
