import * as Comlink from 'comlink';
import { createEngineWorkerApi } from './engine-worker.js';

/**
 * Entry of a Web Worker (started by src/pool/browser.ts; the page's bundler compiles it). The test
 * fault hook is a Node-only tool, so it is never set here.
 */
Comlink.expose(
  createEngineWorkerApi(null, () => {
    self.close();
    throw new Error('worker closed');
  }),
);
