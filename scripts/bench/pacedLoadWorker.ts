/**
 * The loaded live phase's background ingest on a worker thread of its own (pacedLoad.ts), so
 * sending 1,000 requests a second and reading their answers does not delay the probe's thread.
 */
import { parentPort, workerData } from 'node:worker_threads';

import { startPacedLoad, type PacedLoadSpec } from './pacedLoad';
import { createReadingSource } from './readings';

export type PacedLoadWorkerSpec = Omit<PacedLoadSpec, 'body'> & {
  /** Where this thread's reading times start: apart from the main thread's, so none repeats. */
  readingsStartMs: number;
};

const spec = workerData as PacedLoadWorkerSpec;
const readings = createReadingSource(spec.readingsStartMs);
const load = startPacedLoad({
  ...spec,
  body: (n) => (n === 1 ? readings.singleBody() : readings.batchBody(n)),
});
parentPort!.once('message', () => {
  void load.stop().then((result) => parentPort!.postMessage(result));
});
