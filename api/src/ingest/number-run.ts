/**
 * The number-run reader of JSON sample bodies: number-run.wat, compiled to number-run.wasm, reads a
 * run of array elements that are plain numbers, each followed at once by "," or "]", and stops at
 * anything else for the JavaScript reader (json-samples.ts) to read or to name the error.
 *
 * Why WebAssembly: numbers are most of a JSON sample body, and reading them byte by byte in
 * JavaScript was the largest part of the server's work on `{"t","a"}` batches (a third of the main
 * thread under the ingest bench). The module reads the same numbers about 2.5 times as fast, and
 * gives the same doubles (Clinger's fast path; see the .wat).
 *
 * One module instance serves every request: a read is synchronous, so requests cannot interleave
 * within one. The bytes are copied into the module's memory once per Buffer (up to inputCapacity
 * bytes at a time); `forgetNumberRunInput()` drops that copy, for a caller whose Buffer may change.
 */
import { readFileSync } from 'node:fs';

// The WebAssembly API as used here (TypeScript's ES libraries do not declare it; Node provides it).
declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object) => { exports: unknown };
};
interface Global {
  value: number;
}
interface NumberRunExports {
  memory: { buffer: ArrayBuffer };
  numberRun(p: number, end: number): number;
  stop: Global;
  closed: Global;
  outputAt: Global;
  outputCapacity: Global;
  inputAt: Global;
  inputCapacity: Global;
}

const wasm = new WebAssembly.Instance(
  new WebAssembly.Module(readFileSync(new URL('./number-run.wasm', import.meta.url))),
).exports as NumberRunExports;

const INPUT_AT = wasm.inputAt.value;
const INPUT_CAPACITY = wasm.inputCapacity.value;
const input = new Uint8Array(wasm.memory.buffer, INPUT_AT, INPUT_CAPACITY);

/** Most values one read returns. */
export const NUMBER_RUN_CAPACITY = wasm.outputCapacity.value;

/** The values of the last read, in [0, count). */
export const numberRunValues = new Float64Array(wasm.memory.buffer, wasm.outputAt.value, NUMBER_RUN_CAPACITY);

/** Where the last read ended: the index after the last "," or "]" it took (its p when it took none), and whether that was "]". */
export const numberRunEnd = { stop: 0, closed: false };

/** The Buffer whose bytes [loadedFrom, loadedTo) are in the module's memory. */
let loaded: Uint8Array | null = null;
let loadedFrom = 0;
let loadedTo = 0;

/** Drops the copy of the last Buffer read, so that the next read copies its bytes again. */
export function forgetNumberRunInput(): void {
  loaded = null;
}

/**
 * Reads the run of plain-number elements that starts at buf[p], looking no further than buf[end - 1]
 * (nor further than inputCapacity bytes from where the copy started): returns how many it read (at
 * most NUMBER_RUN_CAPACITY), their values in numberRunValues, and where it ended in numberRunEnd.
 */
export function readNumberRun(buf: Uint8Array, p: number, end: number): number {
  if (buf !== loaded || p < loadedFrom || p >= loadedTo) {
    loaded = buf;
    loadedFrom = p;
    loadedTo = Math.min(end, p + INPUT_CAPACITY);
    input.set(buf.subarray(loadedFrom, loadedTo));
  }
  const offset = INPUT_AT - loadedFrom;
  const count = wasm.numberRun(p + offset, Math.min(end, loadedTo) + offset);
  numberRunEnd.stop = wasm.stop.value - offset;
  numberRunEnd.closed = wasm.closed.value === 1;
  return count;
}
