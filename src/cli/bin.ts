#!/usr/bin/env node
import { setFlagsFromString } from 'node:v8';
// React's development build is about 4x slower per frame; set production before it loads.
process.env.NODE_ENV ??= 'production';
// V8 doubles the young generation as a long run allocates, up to 3 x 16 MiB, so a plain run's
// peak memory grew with its length (86 MB after 100k events, 118 MB after 1M). Keeping the
// young generation at its first size holds it flat (73 and 90 MB) at the same speed; this is
// read at every growth, so setting it here, before the work starts, is enough (DEVELOPERS.md).
setFlagsFromString('--semi-space-growth-factor=1');
const { main } = await import('./main.js');
const { processIo } = await import('./io.js');
process.exitCode = await main(process.argv.slice(2), processIo());
