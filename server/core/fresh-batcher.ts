/**
 * Loads rows by key in batches for requests that must see the database as it is after they
 * arrived. A request joins the pending batch, and a batch's query starts only after every request
 * in it has arrived, so every answer comes from a query begun after its request came in. At most
 * `maxInFlight` queries run at once; while that many are under way, arriving requests gather in the
 * next batch and share its query (the batching of the well-known DataLoader pattern, kept exact).
 * When the process is quiet, a request's query starts at once; one slow query never holds up the
 * others beyond the in-flight limit.
 */
export class FreshBatcher<K, V> {
  private pending: { keys: Set<K>; gate: () => void; result: Promise<Map<K, V>> } | null = null;
  private inFlight = 0;

  constructor(
    private readonly fetch: (keys: K[]) => Promise<Map<K, V>>,
    private readonly maxInFlight = 4,
  ) {}

  load(key: K): Promise<V | undefined> {
    this.pending ??= this.newBatch();
    const batch = this.pending;
    batch.keys.add(key);
    this.runNext();
    return batch.result.then((rows) => rows.get(key));
  }

  private newBatch() {
    const keys = new Set<K>();
    let gate!: () => void;
    const opened = new Promise<void>((resolve) => (gate = resolve));
    return { keys, gate, result: opened.then(() => this.fetch([...keys])) };
  }

  private runNext(): void {
    const batch = this.pending;
    if (!batch || this.inFlight >= this.maxInFlight) return;
    this.pending = null;
    this.inFlight += 1;
    batch.gate();
    const done = () => {
      this.inFlight -= 1;
      this.runNext();
    };
    batch.result.then(done, done);
  }
}
