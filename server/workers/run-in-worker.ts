import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/**
 * tsx's ESM loader, registered first in each worker: the server runs its TypeScript through tsx,
 * and a worker thread starts without the parent's loaders. (Resolved once; `tsx/esm/api` resolves
 * to its CommonJS build from here, and the ESM build sits beside it.)
 */
const tsxLoader = pathToFileURL(
  createRequire(import.meta.url)
    .resolve('tsx/esm/api')
    .replace(/\.cjs$/, '.mjs'),
).href;

/** The worker's whole program: register the loader, import the module, call the export, reply. */
const bootstrap = `
const { parentPort, workerData } = require('node:worker_threads');
import(workerData.loader)
  .then((api) => { api.register(); return import(workerData.module); })
  .then((module) => module[workerData.exportName](...workerData.args))
  .then(
    (value) => parentPort.postMessage({ ok: true, value }),
    (error) => parentPort.postMessage({ ok: false, message: String((error && error.message) || error) }),
  );
`;

/**
 * Runs one exported function of a module in a worker thread and resolves with what it returns, so
 * a long, pure computation (an exposure-control simulation) does not hold the server's event loop
 * while respondents answer. Arguments and result cross by structured clone (plain objects, arrays,
 * Maps, typed arrays; no functions or class instances). The worker exits after its one call; a throw
 * inside it rejects here with the same message, and a worker that dies rejects too.
 *
 * @param moduleUrl the module's file URL (`import.meta.url` of the module that exports the function).
 * @param exportName the exported function, called with `args` (it may return a promise).
 */
export function runInWorker<T>(moduleUrl: string, exportName: string, args: readonly unknown[]): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const worker = new Worker(bootstrap, {
      eval: true,
      workerData: { loader: tsxLoader, module: moduleUrl, exportName, args },
    });
    let settled = false;
    worker.once('message', (reply: { ok: true; value: T } | { ok: false; message: string }) => {
      settled = true;
      void worker.terminate();
      if (reply.ok) resolve(reply.value);
      else reject(new Error(reply.message));
    });
    worker.once('error', (error) => {
      settled = true;
      reject(error);
    });
    worker.once('exit', (code) => {
      if (!settled) reject(new Error(`worker for ${exportName} exited with code ${code} before replying`));
    });
  });
}
