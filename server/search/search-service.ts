import pg from 'pg';
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { loadApproved, loadApprovedOf } from './documents';
import { SearchIndex } from './search-index';

export const SEARCH_CHANNEL = 'benchwright_search';

/**
 * Keeps this process's search index equal to the approved revisions in PostgreSQL. A trigger
 * NOTIFYs on every revision state change (at commit, so the approving server and every other
 * server hear of it); after a lost connection the index is rebuilt in full, so nothing missed
 * while disconnected stays missed.
 */
export class SearchService {
  readonly index = new SearchIndex();
  private listener?: pg.Client;
  private stopped = false;
  private retryMs = 500;
  private ready: Promise<void> | undefined;
  /** Resolves when a notification for the procedure has been applied (tests and diagnostics). */
  private waiters = new Map<string, (() => void)[]>();
  private changeListeners: ((procedureId: string | null) => void)[] = [];

  constructor(
    private readonly db: Db,
    private readonly connectionString: string,
    private readonly logger: Logger,
  ) {}

  /** True while the LISTEN connection is up: only then is a change made anywhere heard here. */
  get listening() {
    return this.listener !== undefined;
  }

  /**
   * Calls cb when the library changed (a revision's state, in any process): with the procedure's id
   * when the notification is heard and again once the search index has applied it, and with null
   * when anything may have changed (the listener was lost, the index rebuilt).
   */
  onLibraryChange(cb: (procedureId: string | null) => void) {
    this.changeListeners.push(cb);
  }

  private announce(procedureId: string | null) {
    for (const cb of this.changeListeners) cb(procedureId);
  }

  start(): Promise<void> {
    this.ready ??= this.connect();
    return this.ready;
  }

  async stop() {
    this.stopped = true;
    const listener = this.listener;
    this.listener = undefined;
    await listener?.end().catch(() => undefined);
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({ connectionString: this.connectionString, connectionTimeoutMillis: 3_000 });
    client.on('error', (err) => this.lost(client, err));
    client.on('end', () => this.lost(client));
    client.on('notification', (n) => {
      if (n.channel !== SEARCH_CHANNEL || !n.payload) return;
      this.announce(n.payload);
      void this.refresh(n.payload);
    });
    try {
      await client.connect();
      await client.query(`LISTEN ${SEARCH_CHANNEL}`);
      this.listener = client;
      await this.rebuild();
      this.retryMs = 500;
    } catch (err) {
      await client.end().catch(() => undefined);
      this.lost(client, err as Error);
      throw err;
    }
  }

  private handled = new WeakSet<pg.Client>();

  private lost(client: pg.Client, err?: Error) {
    // 'error' and 'end' both arrive for one failure: react once per connection.
    if (this.stopped || this.handled.has(client) || (this.listener && this.listener !== client)) return;
    this.handled.add(client);
    this.listener = undefined;
    this.announce(null);
    if (err) this.logger.warn({ msg: err.message }, 'search listener lost; will reconnect and rebuild');
    const wait = this.retryMs;
    this.retryMs = Math.min(this.retryMs * 2, 10_000);
    setTimeout(() => {
      if (!this.stopped && !this.listener) this.connect().catch(() => undefined);
    }, wait).unref();
  }

  /** Rebuilds the whole index from PostgreSQL, logging progress for large libraries. */
  async rebuild() {
    const started = Date.now();
    const docs = await loadApproved(this.db, (n) => {
      if (n % 5_000 === 0 && n > 0)
        this.logger.info({ indexed: n }, 'search index: loading approved revisions…');
    });
    this.index.replaceAll(docs);
    this.announce(null);
    this.logger.info({ procedures: docs.length, ms: Date.now() - started }, 'search index built');
  }

  /** Re-reads one procedure's approved revision (or drops it when none is approved any more). */
  async refresh(procedureId: string) {
    try {
      const doc = await loadApprovedOf(this.db, procedureId);
      if (doc) this.index.upsert(doc);
      else this.index.remove(procedureId);
      this.announce(procedureId);
    } catch (err) {
      this.logger.warn({ procedureId, msg: (err as Error).message }, 'search refresh failed; rebuilding');
      await this.rebuild().catch(() => undefined);
    }
    for (const resolve of this.waiters.get(procedureId) ?? []) resolve();
    this.waiters.delete(procedureId);
  }

  /** Resolves after the next refresh of this procedure (for tests that cross two servers). */
  nextRefreshOf(procedureId: string, timeoutMs = 5_000) {
    return new Promise<boolean>((resolve) => {
      const timer = setTimeout(() => resolve(false), timeoutMs);
      const list = this.waiters.get(procedureId) ?? [];
      list.push(() => {
        clearTimeout(timer);
        resolve(true);
      });
      this.waiters.set(procedureId, list);
    });
  }
}
