#!/usr/bin/env node
// React's development build is about 4x slower per frame; set production before it loads.
process.env.NODE_ENV ??= 'production';
const { main } = await import('./main.js');
const { processIo } = await import('./io.js');
process.exitCode = await main(process.argv.slice(2), processIo());
