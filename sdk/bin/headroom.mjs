#!/usr/bin/env node
// `headroom` command line. The SDK ships as TypeScript sources; tsx (a dependency) compiles them on
// load, so there is no build step and `npx headroom` runs the code in the workspace as it is.
import { register } from 'tsx/esm/api';

register();
await import('../src/cli/main.ts');
