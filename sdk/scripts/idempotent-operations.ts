/**
 * Writes `src/generated/idempotent-operations.ts` from `../openapi.yaml`: the operations that declare an
 * `Idempotency-Key` header, i.e. those where the server keeps the first answer for a key. The retry
 * layer retries a POST or PATCH after an ambiguous failure (a connection lost after sending, a 500) only
 * for these. Run by `npm run generate -w sdk` (part of `npm run openapi`); never edit the output.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'yaml';

const sdkDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const [input = path.join(sdkDir, '../openapi.yaml'), output = path.join(sdkDir, 'src/generated/idempotent-operations.ts')] = process.argv.slice(2);

interface Parameter {
  in?: string;
  name?: string;
}
type Document = { paths?: Record<string, Record<string, { parameters?: Parameter[] } | undefined>> };

const document = parse(readFileSync(input, 'utf8')) as Document;
const operations: string[] = [];
for (const [route, item] of Object.entries(document.paths ?? {})) {
  for (const method of ['post', 'patch', 'put', 'delete']) {
    const parameters = item[method]?.parameters ?? [];
    if (parameters.some((p) => p.in === 'header' && p.name?.toLowerCase() === 'idempotency-key')) operations.push(`${method.toUpperCase()} ${route}`);
  }
}
operations.sort();

writeFileSync(
  output,
  `/**
 * This file was generated from openapi.yaml by sdk/scripts/idempotent-operations.ts.
 * Do not make direct changes to the file.
 *
 * Operations whose server keeps the first answer for an Idempotency-Key ("METHOD /path/{param}").
 */
export const IDEMPOTENT_OPERATIONS: readonly string[] = ${JSON.stringify(operations, null, 2).replace(/"/g, "'")};
`,
);
