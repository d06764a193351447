/** The sweep worker thread: loads the job's inputs once, then runs the seeds it is sent. */
import { prepareJob, runSeed } from './run-seed.js';
import { serveTasks } from './serve.js';
import type { SweepJob } from './types.js';

serveTasks((data) => prepareJob(data as SweepJob), runSeed);
