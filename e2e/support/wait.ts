/**
 * Reads a value until it satisfies `ok` or the time is up, and returns the last value read either way: the
 * caller asserts on it, so a wrong app still fails (with the value it showed), while a right one is not read
 * before it has rendered. For values a locator's waitFor cannot express (an input's value, a computed count).
 */
export async function until<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 10_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let value = await read();
  while (!ok(value) && Date.now() < deadline) {
    await new Promise((resolve) => setTimeout(resolve, 100));
    value = await read();
  }
  return value;
}
