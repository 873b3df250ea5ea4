import { FreshBatcher } from './fresh-batcher';

/** A fetch whose calls wait until the test lets them finish, recording the keys and when each began. */
function controlledFetch() {
  const calls: { keys: number[]; finish: () => void }[] = [];
  let stateAtStart = 0;
  const state = { value: 0 };
  const fetch = (keys: number[]) => {
    stateAtStart = state.value;
    const seen = stateAtStart;
    return new Promise<Map<number, number>>((resolve) => {
      calls.push({ keys, finish: () => resolve(new Map(keys.map((k) => [k, seen]))) });
    });
  };
  return { calls, fetch, state };
}

const tick = () => new Promise((resolve) => setImmediate(resolve));

describe('FreshBatcher', () => {
  it('starts a lone request at once', async () => {
    const { calls, fetch } = controlledFetch();
    const batcher = new FreshBatcher(fetch);
    const answer = batcher.load(7);
    await tick();
    expect(calls.map((c) => c.keys)).toEqual([[7]]);
    calls[0].finish();
    expect(await answer).toBe(0);
  });

  it('gives the requests that arrive while the fetches are under way one later fetch, begun after they came', async () => {
    const { calls, fetch, state } = controlledFetch();
    const batcher = new FreshBatcher(fetch, 1);
    const first = batcher.load(1);
    await tick();
    // A change commits while the first fetch is under way; then three requests arrive.
    state.value = 1;
    const later = [batcher.load(1), batcher.load(2), batcher.load(2)];
    await tick();
    expect(calls).toHaveLength(1); // they wait for the fetch under way to finish…
    calls[0].finish();
    await tick();
    expect(calls.map((c) => c.keys)).toEqual([[1], [1, 2]]); // …then share one fetch
    calls[1].finish();
    // The first request saw the state before the change; the later ones see it after, never before.
    expect(await first).toBe(0);
    expect(await Promise.all(later)).toEqual([1, 1, 1]);
  });

  it('lets a second fetch start while a slow one is under way, up to the limit', async () => {
    const { calls, fetch } = controlledFetch();
    const batcher = new FreshBatcher(fetch, 2);
    const slow = batcher.load(1);
    await tick();
    const quick = batcher.load(2);
    await tick();
    expect(calls.map((c) => c.keys)).toEqual([[1], [2]]);
    const waiting = [batcher.load(3), batcher.load(4)];
    await tick();
    expect(calls).toHaveLength(2); // both slots busy: 3 and 4 gather in the next batch
    calls[1].finish();
    expect(await quick).toBe(0);
    await tick();
    expect(calls.map((c) => c.keys)).toEqual([[1], [2], [3, 4]]);
    calls[2].finish();
    expect(await Promise.all(waiting)).toEqual([0, 0]);
    calls[0].finish();
    expect(await slow).toBe(0);
  });

  it('passes a failed fetch to its requests and goes on with the next', async () => {
    let n = 0;
    const batcher = new FreshBatcher(async (keys: number[]) => {
      n += 1;
      if (n === 1) throw new Error('database unreachable');
      return new Map(keys.map((k) => [k, k * 10]));
    });
    await expect(batcher.load(3)).rejects.toThrow('database unreachable');
    expect(await batcher.load(4)).toBe(40);
    expect(await batcher.load(5)).toBe(50);
  });
});
