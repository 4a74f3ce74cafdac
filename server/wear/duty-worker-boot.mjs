// Entry of a nightly duty worker thread: Node 20 does not pass the parent's TypeScript loader
// to a worker's entry file, so this plain module loads tsx and then the worker itself.
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

await tsImport(workerData.entry, import.meta.url);
