/**
 * Compiles number-run.wat to number-run.wasm with wabt (the WebAssembly Binary Toolkit): run
 * `npm run wasm -w api` after changing the .wat, and commit both. The server loads only the .wasm,
 * so it needs no compiler; number-run.test.ts checks that the committed .wasm is this compile of the .wat.
 */
import { readFile, writeFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import wabtInit from 'wabt';

export const WAT_FILE = fileURLToPath(new URL('./number-run.wat', import.meta.url));
export const WASM_FILE = fileURLToPath(new URL('./number-run.wasm', import.meta.url));

/** The module's bytes, compiled from the .wat text. */
export async function compileNumberRun(): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const module = wabt.parseWat('number-run.wat', await readFile(WAT_FILE, 'utf8'));
  try {
    module.validate();
    return module.toBinary({}).buffer;
  } finally {
    module.destroy();
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const bytes = await compileNumberRun();
  await writeFile(WASM_FILE, bytes);
  console.log(`wrote ${WASM_FILE} (${bytes.length} bytes)`);
}
