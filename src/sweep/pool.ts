/**
 * A pool of worker threads that takes tasks one at a time, so a slow seed never holds up
 * the others. A worker that dies (an uncaught error, running out of memory, an exit) turns
 * its task into a result through `crashed`, and a fresh worker takes its place; a worker
 * that dies before it is ready means the pool itself is broken, and the run rejects.
 */
import { Worker, type ResourceLimits } from 'node:worker_threads';

/** What the main thread sends a worker. */
export interface TaskMessage<T> {
  readonly type: 'task';
  readonly task: T;
}

/** What a worker sends back: `ready` once its setup is done, then one `result` per task, in order. */
export type WorkerMessage<R> = { readonly type: 'ready' } | { readonly type: 'result'; readonly result: R };

/** What a worker finds in `workerData`: the module it runs and the data for its setup. */
export interface PoolWorkerData {
  readonly entry: string;
  readonly data: unknown;
}

export interface PoolOptions<T, R> {
  /** The worker module: a compiled `.js` file, or a `.ts` file when bellstep runs from its sources. */
  readonly entry: URL;
  /** Handed to every worker's setup. */
  readonly data: unknown;
  readonly workers: number;
  readonly resourceLimits?: ResourceLimits;
  /** The result to record for a task whose worker died while running it. */
  crashed(task: T, message: string): R;
  /** Called as each result comes in (in completion order), e.g. for progress. */
  onResult?(task: T, result: R): void;
  /** What to keep of a result once `onResult` has seen it, e.g. without its bulky parts. */
  keep?(result: R): R;
}

// A worker written in TypeScript cannot be loaded by node itself: under the tests and tsx a
// small plain-JS module registers tsx's loader inside the worker, then imports the entry.
const FROM_SOURCE = new URL('./worker-from-source.mjs', import.meta.url);

function spawn(entry: URL, data: unknown, resourceLimits: ResourceLimits | undefined): Worker {
  const workerData: PoolWorkerData = { entry: entry.href, data };
  const file = entry.pathname.endsWith('.ts') ? FROM_SOURCE : entry;
  // a worker's stdout is captured and dropped: stdout belongs to the JSON the sweep prints
  const worker = new Worker(file, { workerData, resourceLimits, stdout: true });
  worker.stdout.resume();
  return worker;
}

function describeExit(error: Error | undefined, code: number): string {
  if (error) {
    const oom = (error as NodeJS.ErrnoException).code === 'ERR_WORKER_OUT_OF_MEMORY';
    return oom ? `the worker ran out of memory (${error.message})` : `the worker crashed: ${error.message}`;
  }
  return `the worker exited with code ${code}`;
}

/** Runs every task on up to `workers` threads; results come back in task order. */
export function runPool<T, R>(tasks: readonly T[], opts: PoolOptions<T, R>): Promise<R[]> {
  const results: R[] = new Array(tasks.length);
  let next = 0;
  let done = 0;
  const live = new Set<Worker>();

  return new Promise<R[]>((resolve, reject) => {
    let settled = false;
    const finish = (err?: Error) => {
      if (settled) return;
      settled = true;
      const stopping = [...live].map((w) => w.terminate());
      live.clear();
      void Promise.all(stopping).then(
        () => (err ? reject(err) : resolve(results)),
        () => (err ? reject(err) : resolve(results)),
      );
    };

    const record = (index: number, result: R) => {
      done++;
      opts.onResult?.(tasks[index], result);
      results[index] = opts.keep ? opts.keep(result) : result;
      if (done === tasks.length) finish();
    };

    const start = () => {
      const worker = spawn(opts.entry, opts.data, opts.resourceLimits);
      live.add(worker);
      let ready = false;
      let current: number | undefined;
      let error: Error | undefined;
      const feed = () => {
        if (next >= tasks.length) {
          current = undefined;
          return;
        }
        current = next++;
        worker.postMessage({ type: 'task', task: tasks[current] } satisfies TaskMessage<T>);
      };
      worker.on('message', (m: WorkerMessage<R>) => {
        if (settled) return;
        if (m.type === 'ready') ready = true;
        else if (current !== undefined) {
          const index = current;
          feed();
          record(index, m.result);
        }
      });
      worker.on('error', (e) => {
        error = e;
      });
      worker.on('exit', (code) => {
        if (settled || !live.delete(worker)) return;
        if (!ready) {
          finish(new Error(`a sweep worker failed to start: ${describeExit(error, code)}`));
          return;
        }
        const lost = current;
        if (lost !== undefined) record(lost, opts.crashed(tasks[lost], describeExit(error, code)));
        if (!settled && next < tasks.length) start();
      });
      feed();
    };

    if (tasks.length === 0) {
      finish();
      return;
    }
    const k = Math.max(1, Math.min(opts.workers, tasks.length));
    for (let i = 0; i < k; i++) start();
  });
}
