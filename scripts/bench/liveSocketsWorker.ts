/** The worker thread that holds the live phase's watching sockets (liveSockets.ts). */
import { parentPort, workerData } from 'node:worker_threads';

import {
  connectHere,
  type LiveClientsSpec,
  type WorkerReply,
  type WorkerRequest,
} from './liveSockets';

const port = parentPort!;
const reply = (message: WorkerReply) => port.postMessage(message);

async function main() {
  const clients = await connectHere(workerData as LiveClientsSpec);
  port.on('message', (request: WorkerRequest) => {
    const answer = async (): Promise<WorkerReply> => {
      switch (request.op) {
        case 'record':
          await clients.record();
          return { id: request.id };
        case 'collect':
          return {
            id: request.id,
            report: await clients.collect(request.expected, request.graceMs),
          };
        case 'close':
          await clients.close();
          return { id: request.id };
      }
    };
    answer().then(reply, (err: unknown) =>
      reply({ id: request.id, error: err instanceof Error ? err.message : String(err) }),
    );
  });
  reply({ id: 0, ready: clients.count });
}

// A failed connect is an unhandled rejection here, which ends the worker with an 'error' event:
// the main thread's connect rejects with it.
void main();
