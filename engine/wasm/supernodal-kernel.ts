import { SUPERNODAL_KERNEL_BASE64 } from './supernodal-kernel-binary';

/**
 * Runs the numeric factorisation and the triangular solves of a supernodal Cholesky
 * (../supernodal-cholesky.ts) in the WebAssembly kernel of ./assembly/supernodal-kernel.ts.
 * The kernel's arrays live in a WebAssembly memory; a few such memories ("slots") are kept for
 * the whole process and lent to factorisations in turn, so thousands of short-lived solvers (a
 * sizing search, a simulation) do not each reserve one. A factorisation that loses its slot to
 * another keeps its factor: it is copied out first, and its solves then run in JavaScript.
 * Where WebAssembly is missing or refused (a page whose CSP forbids it, a browser's main thread
 * refusing a synchronous compile) `create` answers null and the caller stays in JavaScript.
 */

/** What the kernel reads of a supernodal structure (fields of SupernodalCholesky). */
export interface KernelStructure {
  readonly n: number;
  readonly supernodes: number;
  readonly first: Int32Array;
  readonly rowPtr: Int32Array;
  readonly rows: Int32Array;
  readonly blockPtr: Int32Array;
  readonly superOf: Int32Array;
  readonly scatterFrom: Int32Array;
  readonly scatterTo: Int32Array;
  /** Fill-reducing permutation (column k of the factor is row perm[k] of A). */
  readonly perm: Int32Array;
  /** Length of A's value array. */
  readonly valueCount: number;
  /** Length of the two-column update buffer. */
  readonly updateLength: number;
}

/** The parts of the WebAssembly API used here (the engine is compiled without DOM or Node types). */
interface WasmMemory {
  readonly buffer: ArrayBuffer;
  grow(pages: number): number;
}
interface WasmApi {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number }) => WasmMemory;
}
interface KernelExports {
  setup(...offsets: number[]): void;
  factor(): number;
  solve(io: number): void;
}

/** Memories kept for the process (each grows to the largest structure it has held). */
const SLOT_COUNT = 4;
const PAGE_BYTES = 65536;

interface Layout {
  bytes: number;
  first: number;
  rowPtr: number;
  rows: number;
  blockPtr: number;
  superOf: number;
  relative: number;
  head: number;
  next: number;
  position: number;
  map: number;
  update: number;
  block: number;
  values: number;
  scatterFrom: number;
  scatterTo: number;
  work: number;
  perm: number;
  io: number;
}

/** Byte offsets of every array of `s` in one memory, each 16-byte aligned. */
function layoutOf(s: KernelStructure): Layout {
  let at = 0;
  const take = (length: number, width: number): number => {
    at = (at + 15) & ~15;
    const start = at;
    at += Math.max(length, 1) * width;
    return start;
  };
  const ns = s.supernodes;
  const layout = {
    first: take(ns + 1, 4),
    rowPtr: take(ns + 1, 4),
    rows: take(s.rows.length, 4),
    blockPtr: take(ns + 1, 4),
    superOf: take(s.n, 4),
    relative: take(s.n, 4),
    head: take(ns, 4),
    next: take(ns, 4),
    position: take(ns, 4),
    map: take(s.updateLength >> 1, 4),
    update: take(s.updateLength, 8),
    block: take(s.blockPtr[ns], 8),
    values: take(s.valueCount, 8),
    scatterFrom: take(s.scatterFrom.length, 4),
    scatterTo: take(s.scatterTo.length, 4),
    work: take(s.n, 8),
    perm: take(s.n, 4),
    io: take(s.n, 8),
  };
  return { ...layout, bytes: at + 16 };
}

class Slot {
  get user(): WasmSupernodal | null {
    return this.owner?.deref() ?? null;
  }
  set user(user: WasmSupernodal | null) {
    this.owner = user ? new WeakRef(user) : null;
  }
  /** The factorisation whose factor is in memory, held weakly: a slot never keeps a dead solver alive. */
  private owner: WeakRef<WasmSupernodal> | null = null;
  /** The structure whose arrays are in memory (shared structures are not copied again). */
  structure: KernelStructure | null = null;
  layout: Layout | null = null;
  lastUse = 0;
  constructor(
    readonly memory: WasmMemory,
    readonly kernel: KernelExports,
  ) {}

  /** Makes `user`'s structure the one in memory, growing it when needed. */
  load(user: WasmSupernodal): Layout {
    const s = user.structure;
    if (this.structure === s && this.layout) return this.layout;
    const layout = layoutOf(s);
    const missing = layout.bytes - this.memory.buffer.byteLength;
    if (missing > 0) this.memory.grow(Math.ceil(missing / PAGE_BYTES));
    const buffer = this.memory.buffer;
    const put = (at: number, a: Int32Array): void => new Int32Array(buffer, at, a.length).set(a);
    put(layout.first, s.first);
    put(layout.rowPtr, s.rowPtr);
    put(layout.rows, s.rows);
    put(layout.blockPtr, s.blockPtr);
    put(layout.superOf, s.superOf);
    put(layout.scatterFrom, s.scatterFrom);
    put(layout.scatterTo, s.scatterTo);
    put(layout.perm, s.perm);
    const L = layout;
    this.kernel.setup(
      s.n,
      s.supernodes,
      s.scatterFrom.length,
      L.first,
      L.rowPtr,
      L.rows,
      L.blockPtr,
      L.superOf,
      L.relative,
      L.head,
      L.next,
      L.position,
      L.map,
      L.update,
      s.updateLength >> 1,
      L.block,
      L.values,
      L.scatterFrom,
      L.scatterTo,
      L.work,
      L.perm,
    );
    this.structure = s;
    this.layout = layout;
    return layout;
  }
}

let api: WasmApi | null | undefined;
let compiled: object | null = null;
const slots: Slot[] = [];
let clock = 0;
let enabled = true;

/**
 * Switches the kernel off (false) or on for factorisations created from now on; returns the
 * previous setting. For side-by-side benchmarks and the specs that compare the two kernels.
 */
export function useWasmKernel(on: boolean): boolean {
  const before = enabled;
  enabled = on;
  return before;
}

/** Whether WebAssembly is available here and the kernel compiled. */
export function wasmKernelAvailable(): boolean {
  return kernelModule() !== null;
}

/** The compiled kernel, or null where WebAssembly is missing or refused (tried once). */
function kernelModule(): object | null {
  if (api !== undefined) return compiled;
  api = (globalThis as { WebAssembly?: WasmApi }).WebAssembly ?? null;
  try {
    if (api) compiled = new api.Module(decodeBase64(SUPERNODAL_KERNEL_BASE64));
  } catch {
    compiled = null;
  }
  return compiled;
}

function newSlot(module: object): Slot | null {
  try {
    const memory = new api!.Memory({ initial: 1 });
    const instance = new api!.Instance(module, { env: { memory } });
    return new Slot(memory, instance.exports as unknown as KernelExports);
  } catch {
    return null;
  }
}

/** A free slot, a new one, or the one used longest ago (its user's factor copied out first). */
function acquire(user: WasmSupernodal): Slot | null {
  const module = kernelModule();
  if (!module) return null;
  let slot = slots.find((s) => s.user === null) ?? null;
  if (!slot && slots.length < SLOT_COUNT) {
    slot = newSlot(module);
    if (slot) slots.push(slot);
  }
  if (!slot) {
    if (slots.length === 0) return null; // not even one memory could be had: JavaScript it is
    slot = slots.reduce((a, b) => (a.lastUse <= b.lastUse ? a : b));
    slot.user?.evicted(slot);
  }
  slot.user = user;
  return slot;
}

/** The WebAssembly side of one SupernodalCholesky. */
export class WasmSupernodal {
  private slot: Slot | null = null;

  private constructor(
    readonly structure: KernelStructure,
    private readonly onEvicted: (block: Float64Array) => void,
  ) {}

  /**
   * A kernel for `structure`, or null where WebAssembly is not available or switched off.
   * @param onEvicted takes the factor's blocks when the slot is lent on (solves then run in JavaScript)
   */
  static create(structure: KernelStructure, onEvicted: (block: Float64Array) => void): WasmSupernodal | null {
    return enabled && kernelModule() ? new WasmSupernodal(structure, onEvicted) : null;
  }

  /** Numeric factorisation of `values` (A's entries in the structure's order); n or the failing column, or −1 if no slot could be had. */
  factor(values: Float64Array): number {
    if (!this.slot || this.slot.user !== this) this.slot = acquire(this);
    const slot = this.slot;
    if (!slot) return -1;
    slot.lastUse = ++clock;
    let layout: Layout;
    try {
      layout = slot.load(this);
    } catch {
      // the memory could not grow to this structure: give the slot back, factor in JavaScript
      slot.user = null;
      slot.structure = null;
      slot.layout = null;
      this.slot = null;
      return -1;
    }
    new Float64Array(slot.memory.buffer, layout.values, values.length).set(values);
    return slot.kernel.factor();
  }

  /** Solves with the factor in the slot; false when the slot was lent on since (the caller solves in JavaScript). */
  solve(b: ArrayLike<number>, x: Float64Array): boolean {
    const slot = this.slot;
    if (!slot || slot.user !== this || !slot.layout) return false;
    slot.lastUse = ++clock;
    const n = this.structure.n;
    const io = new Float64Array(slot.memory.buffer, slot.layout.io, n);
    for (let i = 0; i < n; i++) io[i] = b[i];
    slot.kernel.solve(slot.layout.io);
    x.set(io);
    return true;
  }

  /** The slot goes to another factorisation: keep this one's factor in JavaScript. */
  evicted(slot: Slot): void {
    const layout = slot.layout!;
    const length = this.structure.blockPtr[this.structure.supernodes];
    this.onEvicted(new Float64Array(slot.memory.buffer, layout.block, length).slice());
    this.slot = null;
  }
}

/** Bytes of a base64 string (the engine has neither atob's types nor Node's Buffer). */
function decodeBase64(text: string): Uint8Array {
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
  const value = new Int8Array(128).fill(-1);
  for (let i = 0; i < alphabet.length; i++) value[alphabet.charCodeAt(i)] = i;
  const clean = text.replace(/=+$/, '');
  const out = new Uint8Array(Math.floor((clean.length * 3) / 4));
  let bits = 0;
  let acc = 0;
  let o = 0;
  for (let i = 0; i < clean.length; i++) {
    const v = value[clean.charCodeAt(i)];
    if (v < 0) throw new Error('bad base64');
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[o++] = (acc >> bits) & 0xff;
    }
  }
  return out;
}
