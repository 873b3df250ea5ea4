// A browser test that fails is tried once more, and its first failure is printed either way: a
// shared 2-core machine sometimes misses a UI timing that a person would never notice. In stress mode
// (QWELL_E2E_ANIMATION_RATE, see browser.ts) nothing is retried, so a race shows on the first try, and
// a test may take three times its usual minute (each slowed slide and fade is waited for);
// QWELL_E2E_RETRIES=0 turns retries off at normal speed too.
const asked = process.env['QWELL_E2E_RETRIES'];
const stress = (process.env['QWELL_E2E_ANIMATION_RATE'] ?? '').trim() !== '';
const retries = asked !== undefined && asked.trim() !== '' ? Number(asked) : stress ? 0 : 1;
if (!Number.isInteger(retries) || retries < 0) throw new Error(`QWELL_E2E_RETRIES must be a whole number, got "${asked}"`);
jest.retryTimes(retries, { logErrorsBeforeRetry: true });
if (stress) jest.setTimeout(180_000);
