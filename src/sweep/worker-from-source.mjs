// Runs a worker module written in TypeScript, for when bellstep runs from its sources (the
// tests, `npx tsx src/cli/bin.ts`): node cannot load .ts files by itself, so this registers
// tsx's loader in the worker thread first. Compiled bellstep (dist/) never loads this file.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
