/**
 * Worker thread of the Monte Carlo bench: receives study chunks on its port, runs them with the
 * engine's runStudyChunk, posts the output back and raises its flag in the shared array (the main
 * thread waits on it with Atomics.wait and reads the reply with receiveMessageOnPort).
 */
import { workerData, type MessagePort } from 'node:worker_threads';
import { runStudyChunk, type StudyChunkInput } from '../../shared/engine/worker-run';

const { port, flags, index } = workerData as { port: MessagePort; flags: Int32Array; index: number };

port.on('message', (chunk: StudyChunkInput) => {
  const output = runStudyChunk(chunk);
  port.postMessage(output);
  Atomics.store(flags, index, 1);
  Atomics.notify(flags, index);
});
