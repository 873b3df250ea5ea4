/**
 * Loads rows by key in batches for requests that must see the database as it is after they
 * arrived. A request joins the next batch, and that batch's query starts only when the one under
 * way has finished, so every answer comes from a query begun after its request came in. Under
 * load, the requests that arrive during one round trip share the next query (the batching of the
 * well-known DataLoader pattern, kept exact); when idle, a request's query starts at once.
 */
export class FreshBatcher<K, V> {
  private pending: { keys: Set<K>; gate: () => void; result: Promise<Map<K, V>> } | null = null;
  private running = false;

  constructor(private readonly fetch: (keys: K[]) => Promise<Map<K, V>>) {}

  load(key: K): Promise<V | undefined> {
    this.pending ??= this.newBatch();
    const batch = this.pending;
    batch.keys.add(key);
    if (!this.running) this.runNext();
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
    if (!batch) return;
    this.pending = null;
    this.running = true;
    batch.gate();
    const done = () => {
      this.running = false;
      this.runNext();
    };
    batch.result.then(done, done);
  }
}
