import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { describe, expect, it } from 'vitest';

const sdkSrc = path.dirname(fileURLToPath(import.meta.url));

describe('browser-safe core', () => {
  it('when the SDK entry is bundled for the browser, then no Node-only module is needed', async () => {
    // esbuild's browser platform refuses node: built-ins and leaves nothing to a Node resolver.
    const result = await build({
      entryPoints: [path.join(sdkSrc, 'index.ts')],
      bundle: true,
      platform: 'browser',
      format: 'esm',
      write: false,
      logLevel: 'silent',
      metafile: true,
    });
    const inputs = Object.keys(result.metafile.inputs);
    expect(inputs.some((file) => file.includes('/cli/'))).toBe(false);
    expect(inputs.filter((file) => file.startsWith('node:'))).toEqual([]);
    expect(result.errors).toEqual([]);
  });
});
