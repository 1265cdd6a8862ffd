import { Worker } from 'node:worker_threads';
import type { Ingest } from '../../shared/engine/ingest';
import type { VelocitySampleAccumulator, VelocitySampleSpec, VelocitySampleStatistics } from '../../shared/engine/frame-statistics';
import { GrowableHistogram } from '../../shared/engine/growable-histogram';
import { parseDataBlock, type BlockLayout, type ParsedBlock } from '../../shared/engine/text-parser';
import { createAutocorrelationAccumulator, createMomentAccumulator, type AutocorrelationAccumulator } from '../../shared/stats/index';

/** Text bytes seen before the worker is started (small inputs never start one). */
export const WORKER_AFTER_BYTES = 1 << 20;
/** Text bytes parsed in the main thread before blocks go to the worker. */
export const OFFLOAD_AFTER_BYTES = 4 << 20;
/** Parse blocks in flight: enough for the worker to parse ahead while the main thread computes; bounds memory. */
const MAX_IN_FLIGHT = 4;
/** Worker this many blocks behind: the next block is parsed here at its turn (both threads parse). */
const LOCAL_PARSE_PENDING = 3;
/**
 * Autocorrelation batches (16k samples, ≈ 8 ms of work) queued in the worker before the main thread waits: small
 * batches keep the worker responsive to parse requests, which it serves first.
 */
const MAX_ACF_QUEUED = 32;
/** Autocorrelation batches queued beyond which the next block is parsed here, not in the worker (balance). */
const ACF_BACKLOG = MAX_ACF_QUEUED / 2;
const ACF_BATCH = 1 << 14;

interface ParseReply {
  id: number;
  /** Parsed rows, or null: the block needs the full parser. */
  block: ParsedBlock | null;
  /** The block's bytes, handed back (parsed: their buffer is reused; declined: the full parser reads them). */
  bytes: Uint8Array;
}

interface AcfReply {
  acfId: number;
  rho: Float64Array;
  pairs: Float64Array;
  velocity: VelocitySampleStatistics | null;
}

/** A processed autocorrelation batch's buffers, handed back for the next batches. */
interface AcfBuffers {
  acfBuffers: number;
  buffers: ArrayBuffer[];
}

// The worker runs the engine's self-contained functions from their source text: no module loader is needed,
// so it starts in milliseconds under tsx, vitest or compiled JavaScript alike. (__name: esbuild's keepNames helper.)
const WORKER_SOURCE = `"use strict";
const { parentPort, workerData } = require("node:worker_threads");
const __name = (f) => f;
const parseDataBlock = ${parseDataBlock.toString()};
const createAutocorrelationAccumulator = ${createAutocorrelationAccumulator.toString()};
const createMomentAccumulator = ${createMomentAccumulator.toString()};
const GrowableHistogram = ${GrowableHistogram.toString()};
const queued = new Int32Array(workerData.queued);
const accs = new Map();
const vels = new Map();
const pool = [];
parentPort.on("message", (m) => {
  if (m.type === "parse") {
    for (const r of m.recycle) pool.push(r);
    if (pool.length > 64) pool.splice(0, pool.length - 64);
    const block = parseDataBlock(m.bytes, 0, m.bytes.length, m.layout, pool);
    const transfer = block ? [m.bytes.buffer, block.trackIds.buffer, ...Object.values(block.values).map((v) => v.buffer)] : [m.bytes.buffer];
    parentPort.postMessage({ id: m.id, block, bytes: m.bytes }, transfer);
  } else {
    // Autocorrelation work runs one message per event-loop turn, so parse requests (handled at once) overtake it.
    acfQ.push(m);
    if (acfQ.length === 1) setImmediate(drainAcf);
  }
});
const acfQ = [];
function drainAcf() {
  const m = acfQ.shift();
  if (m.type === "acf-init") {
    accs.set(m.id, createAutocorrelationAccumulator(m.maxLag, m.stride));
    // Speed and component statistics, per frame and in the order of FrameStatistics.add (same numbers).
    if (m.velocity) {
      const v = m.velocity;
      vels.set(m.id, { three: v.dims === 3, sp: new Float64Array(256), speedHist: new GrowableHistogram(v.speedBins, 1, false),
        compHist: [0, 1, 2].map(() => new GrowableHistogram(v.componentBins, 1, true)), speed: createMomentAccumulator(),
        comp: [0, 1, 2].map(() => createMomentAccumulator()) });
    }
  } else if (m.type === "acf") {
    const a = accs.get(m.id);
    const v = vels.get(m.id);
    for (let s = 0; s < m.n; ) {
      let e = s + 1;
      while (e < m.n && m.frame[e] === m.frame[s]) e++;
      const n = e - s, ux = m.vx.subarray(s, e), uy = m.vy.subarray(s, e), uz = m.vz.subarray(s, e);
      a.addFrame(m.frame[s], m.track.subarray(s, e), ux, uy, uz, n);
      if (v) {
        if (v.sp.length < n) v.sp = new Float64Array(2 * n);
        const sp = v.sp;
        for (let k = 0; k < n; k++) sp[k] = Math.sqrt(ux[k] * ux[k] + uy[k] * uy[k] + uz[k] * uz[k]);
        v.speedHist.addCounts(sp, n);
        v.compHist[0].addCounts(ux, n);
        v.compHist[1].addCounts(uy, n);
        if (v.three) v.compHist[2].addCounts(uz, n);
        v.speed.addBatch(sp, n);
        v.comp[0].addBatch(ux, n);
        v.comp[1].addBatch(uy, n);
        if (v.three) v.comp[2].addBatch(uz, n);
      }
      s = e;
    }
    Atomics.sub(queued, 0, 1);
    Atomics.notify(queued, 0);
    const buffers = [m.frame.buffer, m.track.buffer, m.vx.buffer, m.vy.buffer, m.vz.buffer];
    parentPort.postMessage({ acfBuffers: m.id, buffers }, buffers);
  } else if (m.type === "acf-evict") accs.get(m.id).evictBefore(m.frame);
  else if (m.type === "acf-result") {
    const r = accs.get(m.id).result();
    const v = vels.get(m.id);
    const mom = (x) => ({ count: x.count, mean: x.mean, m2: x.m2, m3: x.m3, m4: x.m4 });
    const velocity = v ? { speedHist: v.speedHist.state(), compHist: v.compHist.map((h) => h.state()), speed: mom(v.speed), comp: v.comp.map(mom) } : null;
    accs.delete(m.id);
    vels.delete(m.id);
    parentPort.postMessage({ acfId: m.id, rho: r.rho, pairs: r.pairs, velocity });
  }
  if (acfQ.length > 0) setImmediate(drainAcf);
}
parentPort.postMessage({ ready: true });
`;

/**
 * Feeds an ingest with text chunks and lends it a worker thread once the
 * input has proven large (≥ 1 MiB):
 * - parsing (plain text, from 4 MiB on): whole-line blocks become columns in
 *   the worker (`parseDataBlock`), delivered in file order; a block the fast
 *   parser declines (quotes, exponents, blank lines, problems) is parsed again
 *   here by the full parser, so results and messages are unchanged;
 * - the velocity autocorrelation (both plain and gzip): the samples are
 *   batched to the worker, which runs the same accumulator (after any parse
 *   request waiting: parsing is on the critical path) and, in mode 'full',
 *   the speed and component histograms and moments of the same samples; the
 *   result is fetched before the ingest ends.
 * Buffers are recycled: the columns of a consumed block go back to the worker
 * with the next request, the text buffer comes back with the reply (fewer
 * fresh allocations, page faults and GC for external memory).
 * Validation, kinematics and the other statistics stay in the main thread (one sequential stream); what
 * depends only on the velocity samples moves, as the main thread is the busier one in mode 'full'.
 */
export class ParseOffload {
  private worker: Worker | null = null;
  private ready = false;
  private broken: Error | null = null;
  private active = false;
  private seen = 0;
  private carry: Uint8Array = new Uint8Array(0);
  private nextId = 0;
  private readonly waiting = new Map<number, { resolve: (r: ParseReply) => void; reject: (e: Error) => void }>();
  private readonly acfWaiting = new Map<number, { resolve: (r: AcfReply) => void; reject: (e: Error) => void }>();
  /** Blocks in file order: parsed by the worker (reply) or, when the worker is behind, here at delivery (local). */
  private readonly queue: { reply: Promise<ParseReply> | null; local: Uint8Array | null; bytes: number; done: boolean }[] = [];
  private readyWait: Promise<void> | null = null;
  private onReady = () => {};
  private remote: RemoteAutocorrelation | null = null;
  private acceptRemote = true;
  /** Buffers of consumed blocks, reused for the next ones (fewer fresh allocations and page faults): columns, text. */
  private readonly spare: ArrayBuffer[] = [];
  private readonly spareBytes: ArrayBuffer[] = [];
  /** Autocorrelation batches queued in the worker (shared counter: the worker decrements it). */
  readonly acfQueued = new Int32Array(new SharedArrayBuffer(4));

  /**
   * `parse`: true = parse in the worker after OFFLOAD_AFTER_BYTES, false = never, 'always' = from the first chunk,
   * waiting for the worker (tests). `autocorrelation`: compute it in the worker when one is running.
   */
  constructor(
    private readonly ingest: Ingest,
    private readonly parse: boolean | 'always' = true,
    private readonly autocorrelation = true,
  ) {}

  /**
   * Factory for IngestOptions.createAutocorrelation: in the worker when one runs (with the speed and component
   * statistics when `velocity` is given), else in this thread.
   */
  createAutocorrelation(maxLag: number, originStride: number, velocity?: VelocitySampleSpec): VelocitySampleAccumulator {
    if (!this.autocorrelation || !this.worker || this.broken || !this.acceptRemote) return createAutocorrelationAccumulator(maxLag, originStride);
    this.remote = new RemoteAutocorrelation(this, this.nextId++, maxLag, originStride, velocity);
    return this.remote;
  }

  /** Feeds the next chunk of text. */
  async push(chunk: Uint8Array): Promise<void> {
    this.seen += chunk.length;
    if (!this.active) {
      const wanted = this.parse === 'always' || (this.seen >= WORKER_AFTER_BYTES && (this.parse || this.autocorrelation));
      if (wanted && !this.worker && !this.broken && !this.ingest.stopped) this.start();
      this.ingest.push(chunk);
      if (!this.parse || this.ingest.stopped) return;
      if (this.worker && !this.ready) {
        // Let the worker's "ready" message in (a stream of resolved promises would starve the event loop).
        if (this.parse === 'always') await this.readyWait;
        else await new Promise((r) => setImmediate(r));
      }
      const due = this.parse === 'always' || this.seen >= OFFLOAD_AFTER_BYTES;
      if (due && this.ready && !this.broken && this.ingest.blockLayout()) {
        this.active = true;
        this.carry = this.ingest.takeLeftover();
      }
      return;
    }
    const last = chunk.lastIndexOf(10);
    if (last < 0) {
      this.carry = concat(this.carry, chunk);
      return;
    }
    const block = concat(this.carry, chunk.subarray(0, last + 1), this.spareBytes);
    this.carry = chunk.slice(last + 1);
    this.send(block);
    while (this.queue.length >= MAX_IN_FLIGHT && !this.ingest.stopped) await this.deliverOldest();
  }

  /** Delivers everything in flight and the last partial line, ends the input, fetches the worker's autocorrelation; then call ingest.end(). */
  async finish(): Promise<void> {
    while (this.queue.length > 0) await this.deliverOldest();
    if (this.carry.length > 0) this.ingest.push(this.carry);
    this.carry = new Uint8Array(0);
    // Statistics started from now on (a reorder at the end) compute their autocorrelation here; the last
    // frames go through before the worker's result is fetched.
    this.acceptRemote = false;
    this.ingest.completeInput();
    if (this.remote) await this.remote.fetch();
  }

  close(): void {
    this.queue.length = 0;
    void this.worker?.terminate();
    this.worker = null;
  }

  /** @internal Posts a message to the worker (RemoteAutocorrelation). */
  post(message: unknown, transfer: ArrayBuffer[] = []): void {
    if (this.broken) throw this.broken;
    this.worker!.postMessage(message, transfer);
  }

  /** @internal Waits until at most `limit` autocorrelation batches are queued in the worker. */
  throttle(limit: number): void {
    for (let q = Atomics.load(this.acfQueued, 0); q > limit; q = Atomics.load(this.acfQueued, 0)) {
      // Blocking wait (allowed in Node's main thread): the worker notifies after each batch.
      Atomics.wait(this.acfQueued, 0, q, 1000);
      if (this.broken) throw this.broken;
    }
  }

  /** @internal Asks the worker for the result of accumulator `id`. */
  requestAcf(id: number): Promise<AcfReply> {
    return new Promise<AcfReply>((resolve, reject) => {
      if (this.broken) return reject(this.broken);
      this.acfWaiting.set(id, { resolve, reject });
      this.post({ type: 'acf-result', id });
    });
  }

  private start(): void {
    try {
      const w = new Worker(WORKER_SOURCE, { eval: true, workerData: { queued: this.acfQueued.buffer } });
      this.readyWait = new Promise<void>((r) => (this.onReady = r));
      w.on('message', (m: ParseReply | AcfReply | AcfBuffers | { ready: true }) => {
        if ('acfBuffers' in m) {
          if (this.remote?.id === m.acfBuffers) this.remote.recycle(m.buffers);
        } else if ('ready' in m) {
          this.ready = true;
          this.onReady();
        } else if ('acfId' in m) {
          this.acfWaiting.get(m.acfId)?.resolve(m);
          this.acfWaiting.delete(m.acfId);
        } else {
          this.waiting.get(m.id)?.resolve(m);
          this.waiting.delete(m.id);
        }
      });
      w.on('error', (e) => this.fail(e));
      w.on('exit', (code) => {
        if (this.worker) this.fail(new Error(`ingest worker exited (${code})`));
      });
      this.worker = w;
    } catch (e) {
      // No worker thread available: everything stays in this thread.
      this.broken = e as Error;
    }
  }

  private fail(e: Error): void {
    this.broken = e;
    this.ready = true;
    this.onReady();
    for (const w of [...this.waiting.values(), ...this.acfWaiting.values()]) w.reject(e);
    this.waiting.clear();
    this.acfWaiting.clear();
  }

  private send(bytes: Uint8Array): void {
    // Worker behind (blocks still unparsed, as when the main thread has little else to do; or a backlog of
    // autocorrelation batches, as in mode 'full' where it has more to do): this block is parsed here at its turn.
    let pending = 0;
    for (const q of this.queue) if (q.reply && !q.done) pending++;
    if (pending >= LOCAL_PARSE_PENDING || Atomics.load(this.acfQueued, 0) > ACF_BACKLOG) {
      this.queue.push({ reply: null, local: bytes, bytes: bytes.length, done: true });
      return;
    }
    const id = this.nextId++;
    const item: (typeof this.queue)[number] = { reply: null, local: null, bytes: bytes.length, done: false };
    item.reply = new Promise<ParseReply>((resolve, reject) => {
      if (this.broken) return reject(this.broken);
      this.waiting.set(id, {
        resolve: (r) => {
          item.done = true;
          resolve(r);
        },
        reject,
      });
    });
    // Transferred, not copied: the worker hands the bytes back (reused, or parsed here if it declined the block),
    // with the columns written into the spare buffers sent along.
    const layout = this.ingest.blockLayout() ?? FALLBACK_LAYOUT;
    const recycle = this.spare.splice(0, Math.min(this.spare.length, layout.columns.length + 1));
    if (!this.broken) this.worker!.postMessage({ type: 'parse', id, bytes, layout, recycle }, [bytes.buffer as ArrayBuffer, ...recycle]);
    this.queue.push(item);
  }

  private async deliverOldest(): Promise<void> {
    const item = this.queue.shift()!;
    // Parsed here by the full parser (its fast path is warm from the first blocks; same numbers as the worker's).
    if (item.local) {
      this.ingest.push(item.local);
      // The parser copies what it keeps: the text buffer serves the next blocks.
      if (this.spareBytes.length < 8) this.spareBytes.push(item.local.buffer as ArrayBuffer);
      return;
    }
    const r = await item.reply!;
    if (!r.block) return this.ingest.push(r.bytes);
    this.ingest.pushParsed(r.block, r.block.count, item.bytes);
    this.recycle(r.block, r.bytes);
  }

  /** A block consumed by the ingest (which copies what it keeps): its buffers serve the next blocks. */
  private recycle(block: ParsedBlock, bytes: Uint8Array): void {
    if (this.spare.length < 64) {
      this.spare.push(block.trackIds.buffer as ArrayBuffer);
      for (const v of Object.values(block.values)) this.spare.push(v.buffer as ArrayBuffer);
    }
    if (this.spareBytes.length < 8) this.spareBytes.push(bytes.buffer as ArrayBuffer);
  }
}

/**
 * Velocity-autocorrelation accumulator computed in the worker (with the speed and component statistics when a
 * {@link VelocitySampleSpec} is given): samples are batched (16k, whole frames, so the worker adds each frame as
 * this thread would) and sent in order, evictions forwarded; result() is available after fetch(). Same
 * estimator, same numbers as in this thread. Batch buffers come back from the worker for reuse.
 */
class RemoteAutocorrelation implements VelocitySampleAccumulator {
  private n = 0;
  private frame!: Float64Array;
  private track!: Int32Array;
  private vx!: Float64Array;
  private vy!: Float64Array;
  private vz!: Float64Array;
  private readonly spare: ArrayBuffer[][] = [];
  private cached: { rho: Float64Array; pairs: Float64Array; velocity: VelocitySampleStatistics | null } | null = null;
  readonly velocityStatistics?: () => VelocitySampleStatistics;

  constructor(private readonly link: ParseOffload, readonly id: number, maxLag: number, originStride: number, velocity?: VelocitySampleSpec) {
    link.post({ type: 'acf-init', id, maxLag, stride: originStride, velocity: velocity ?? null });
    this.allocate(ACF_BATCH);
    if (velocity)
      this.velocityStatistics = () => {
        if (!this.cached?.velocity) throw new Error('the velocity statistics computed in the worker were not fetched before the end');
        return this.cached.velocity;
      };
  }

  add(track: number, frame: number, vx: number, vy: number, vz: number): void {
    this.addFrame(frame, [track], [vx], [vy], [vz], 1);
  }

  addFrame(frame: number, track: ArrayLike<number>, vx: ArrayLike<number>, vy: ArrayLike<number>, vz: ArrayLike<number>, count: number): void {
    if (this.n + count > this.frame.length) {
      this.flush();
      if (count > this.frame.length) this.allocate(count);
    }
    const k0 = this.n;
    for (let i = 0; i < count; i++) {
      const k = k0 + i;
      this.frame[k] = frame;
      this.track[k] = track[i];
      this.vx[k] = vx[i];
      this.vy[k] = vy[i];
      this.vz[k] = vz[i];
    }
    this.n += count;
  }

  evictBefore(frame: number): void {
    this.flush();
    this.link.post({ type: 'acf-evict', id: this.id, frame });
  }

  async fetch(): Promise<void> {
    this.flush();
    const r = await this.link.requestAcf(this.id);
    this.cached = { rho: r.rho, pairs: r.pairs, velocity: r.velocity };
  }

  result(): { rho: Float64Array; pairs: Float64Array } {
    if (!this.cached) throw new Error('the autocorrelation computed in the worker was not fetched before the end');
    return { rho: this.cached.rho.slice(), pairs: this.cached.pairs.slice() };
  }

  get activeTracks(): number {
    return NaN;
  }

  /** Buffers of a batch the worker has processed. */
  recycle(buffers: ArrayBuffer[]): void {
    if (this.spare.length < 4 && buffers[0].byteLength === 8 * ACF_BATCH) this.spare.push(buffers);
  }

  private allocate(size: number): void {
    const b = size === ACF_BATCH ? this.spare.pop() : undefined;
    this.frame = b ? new Float64Array(b[0]) : new Float64Array(size);
    this.track = b ? new Int32Array(b[1]) : new Int32Array(size);
    this.vx = b ? new Float64Array(b[2]) : new Float64Array(size);
    this.vy = b ? new Float64Array(b[3]) : new Float64Array(size);
    this.vz = b ? new Float64Array(b[4]) : new Float64Array(size);
  }

  private flush(): void {
    if (this.n === 0) return;
    this.link.throttle(MAX_ACF_QUEUED);
    Atomics.add(this.link.acfQueued, 0, 1);
    const msg = { type: 'acf', id: this.id, n: this.n, frame: this.frame, track: this.track, vx: this.vx, vy: this.vy, vz: this.vz };
    this.link.post(msg, [this.frame.buffer, this.track.buffer, this.vx.buffer, this.vy.buffer, this.vz.buffer] as ArrayBuffer[]);
    this.n = 0;
    this.allocate(ACF_BATCH);
  }
}

// Declines every block (the ingest stopped meanwhile: the bytes are then ignored anyway).
const FALLBACK_LAYOUT: BlockLayout = { delimiter: 44, decimalComma: false, fieldCount: -1, actions: new Int8Array(0), columns: [], columnIndex: new Int32Array(0) };

/** a followed by b, in a spare buffer when one is large enough (else a new one, with room for later reuse). */
function concat(a: Uint8Array, b: Uint8Array, spare?: ArrayBuffer[]): Uint8Array {
  const n = a.length + b.length;
  let buf: ArrayBuffer | undefined;
  if (spare) {
    const j = spare.findIndex((x) => x.byteLength >= n);
    if (j >= 0) buf = spare.splice(j, 1)[0];
  }
  const out = new Uint8Array(buf ?? new ArrayBuffer(spare ? Math.max(n, (1 << 20) + (1 << 16)) : n), 0, n);
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}
