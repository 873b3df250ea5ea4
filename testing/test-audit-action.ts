import type { AuditAction } from '../contract/audit';

/**
 * An action code of a spec's own ("test.tail"), outside the contract's table on purpose: the spec finds
 * its events by it, and the trail reads it as its parts ("Test tail"). Production writes only the table's codes.
 */
export function testAuditAction(code: `test.${string}`): AuditAction {
  return code as AuditAction;
}
