import { createHash } from 'node:crypto';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import type { Request, Response } from 'express';
import { LRUCache } from 'lru-cache';

/** What tells the cache the library changed: the search service's NOTIFY listener. */
export interface LibrarySignal {
  readonly listening: boolean;
  onLibraryChange(cb: (procedureId: string | null) => void): void;
}

/** One approved (or superseded) revision as the reader gets it, serialised once. */
interface Reading {
  revisionId: string;
  procedureId: string;
  body: string;
  /** SHA-256 of the body (base64url, shortened); the ETag adds the audience. */
  digest: string;
}

const MB = 1 << 20;

/**
 * Answers that change only when the library does: approved revisions for the reader (their content
 * is frozen by the database, keyed by its content hash) and the list, filter and search answers of
 * one audience. Every entry goes when a revision of its procedure changes state (any entry of the
 * list kind on any change), heard through PostgreSQL NOTIFY in every process and announced at once
 * by the process that committed it. Without a live listener nothing is served from memory: a change
 * elsewhere could not be heard.
 *
 * An answer computed while a change arrived is not kept (the generation moved on), so a read that
 * began before a commit cannot be cached after the change that should have replaced it.
 */
export class LibraryCache {
  private generation = 0;
  /** By content hash: approved content is frozen, so the hash names the answer. */
  private readonly readings: LRUCache<string, Reading>;
  /** revision id → content hash, for the entries in `readings`. */
  private readonly hashOf = new Map<string, string>();
  private readonly answers = new LRUCache<string, string>({
    maxSize: 16 * MB,
    sizeCalculation: (body, key) => body.length + key.length,
  });

  constructor(private readonly signal?: LibrarySignal) {
    this.readings = new LRUCache<string, Reading>({
      maxSize: 64 * MB,
      sizeCalculation: (r) => r.body.length + 256,
      dispose: (r, hash) => {
        if (this.hashOf.get(r.revisionId) === hash) this.hashOf.delete(r.revisionId);
      },
    });
    signal?.onLibraryChange((procedureId) => this.changed(procedureId));
  }

  private get live() {
    return this.signal?.listening === true;
  }

  /** A change to one procedure's revisions (null: anything may have changed). */
  changed(procedureId: string | null) {
    this.generation++;
    this.answers.clear();
    if (procedureId === null) return this.readings.clear();
    for (const [hash, r] of this.readings.entries())
      if (r.procedureId === procedureId) this.readings.delete(hash);
  }

  /** Marks the start of a computation whose result may be kept by keep/keepReading. */
  begin() {
    return this.generation;
  }

  reading(revisionId: string): Reading | undefined {
    if (!this.live) return undefined;
    const hash = this.hashOf.get(revisionId);
    const r = hash === undefined ? undefined : this.readings.get(hash);
    return r?.revisionId === revisionId ? r : undefined;
  }

  /** Serialises a reader answer, keeping it when the revision's content is frozen. */
  keepReading(
    began: number,
    r: { revisionId: string; procedureId: string; contentHash: string | null; frozen: boolean },
    answer: unknown,
  ): Reading {
    const body = JSON.stringify(answer);
    const reading = { revisionId: r.revisionId, procedureId: r.procedureId, body, digest: digestOf(body) };
    if (r.frozen && r.contentHash && this.live && began === this.generation) {
      this.readings.set(r.contentHash, reading);
      this.hashOf.set(r.revisionId, r.contentHash);
    }
    return reading;
  }

  /** A list, filter or search answer from memory, else computed and kept (when key is not null). */
  async answer(key: string | null, compute: () => unknown): Promise<string> {
    const hit = key !== null && this.live ? this.answers.get(key) : undefined;
    if (hit !== undefined) return hit;
    const began = this.generation;
    const body = JSON.stringify(await compute());
    if (key !== null && this.live && began === this.generation) this.answers.set(key, body);
    return body;
  }
}

const digestOf = (body: string) => createHash('sha256').update(body).digest('base64url').slice(0, 27);

/** Kept answers compressed once per encoding (the compression middleware leaves encoded answers alone). */
const encoded = new LRUCache<string, Buffer>({ maxSize: 32 * MB, sizeCalculation: (b) => b.length });
const COMPRESS_FROM = 1024;
const compress = {
  br: (body: string) => brotliCompressSync(body, { params: { [constants.BROTLI_PARAM_QUALITY]: 5 } }),
  gzip: (body: string) => gzipSync(body),
};

/**
 * Sends a serialised JSON answer. With a digest it gets a strong ETag naming the audience as well,
 * so one person's copy never answers another's where what they may see differs, and a browser may
 * keep it for revalidation only (private, no-cache): a matching If-None-Match gets 304. A strong
 * ETag names bytes, so a compressed answer (made once and kept) carries its encoding in the ETag too.
 */
export function sendJson(
  req: Request,
  res: Response,
  body: string,
  validator?: { digest: string; audience: string },
) {
  if (!validator) return void res.type('application/json').send(body);
  const encoding =
    body.length >= COMPRESS_FROM ? (req.acceptsEncodings('br', 'gzip') as 'br' | 'gzip' | false) : false;
  const tag = `${validator.digest}.${validator.audience}`;
  const etag = encoding ? `"${tag}.${encoding}"` : `"${tag}"`;
  res.set('ETag', etag);
  res.set('Cache-Control', 'private, no-cache');
  res.vary('Accept-Encoding');
  const asked = req.get('if-none-match');
  if (asked && asked.split(/\s*,\s*/).includes(etag)) return void res.status(304).end();
  if (!encoding) return void res.type('application/json').send(body);
  const key = `${tag}.${encoding}`;
  let bytes = encoded.get(key);
  if (!bytes) encoded.set(key, (bytes = compress[encoding](body)));
  res.set('Content-Encoding', encoding);
  res.type('application/json').send(bytes);
}
