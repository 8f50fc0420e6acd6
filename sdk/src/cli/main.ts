import { runCli } from './program.js';

// The process entry of `headroom` (sdk/bin/headroom.mjs loads it). Ctrl-C aborts the request in
// flight: a batch is all-or-nothing on the server, so nothing half-written is left, and the push
// prints how to resume.
const controller = new AbortController();
process.once('SIGINT', () => controller.abort(new DOMException('Interrupted', 'AbortError')));
process.exitCode = await runCli(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, env: process.env }, controller.signal);
