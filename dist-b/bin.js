#!/usr/bin/env node
import { createRequire as __cr } from 'module'; const require = __cr(import.meta.url);

// dist/cli/bin.js
process.env.NODE_ENV ??= "production";
var { main } = await import("./main-4XA7NSUV.js");
var { processIo } = await import("./io-S6BPLA7P.js");
process.exitCode = await main(process.argv.slice(2), processIo());
