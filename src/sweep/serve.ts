/** The worker side of the pool (pool.ts): set up once from `workerData`, then answer tasks one by one. */
import { parentPort, workerData } from 'node:worker_threads';
import type { PoolWorkerData, TaskMessage, WorkerMessage } from './pool.js';

/** Serves tasks in a worker thread; `setup` runs once with the pool's data. */
export function serveTasks<S, T, R>(setup: (data: unknown) => S, handle: (state: S, task: T) => R): void {
  const port = parentPort;
  if (!port) throw new Error('serveTasks runs in a worker thread of the sweep pool');
  const state = setup((workerData as PoolWorkerData).data);
  port.postMessage({ type: 'ready' } satisfies WorkerMessage<R>);
  port.on('message', (m: TaskMessage<T>) => {
    port.postMessage({ type: 'result', result: handle(state, m.task) } satisfies WorkerMessage<R>);
  });
}
