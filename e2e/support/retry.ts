// A browser test that fails is tried once more, and its first failure is printed either way: a
// shared 2-core machine sometimes misses a UI timing that a person would never notice.
jest.retryTimes(1, { logErrorsBeforeRetry: true });
