import { parentPort } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { createEngineWorkerApi } from './engine-worker.js';
import { TEST_FAULT_VARIABLE, parseTestFault } from './test-fault.js';

/** Entry of a Node worker thread (started by src/pool/node.ts from the compiled dist/workers/). */
if (!parentPort) throw new Error('node-entry.js runs only as a worker thread');

// Exit code 70 (internal software error): the thread ends as if it had crashed.
const api = createEngineWorkerApi(parseTestFault(process.env[TEST_FAULT_VARIABLE]), () => process.exit(70));
Comlink.expose(api, nodeEndpoint(parentPort));
