/**
 * Runs a sizing in a Web Worker (Vite's worker import: `new Worker(new URL(…), { type: 'module' })`
 * is bundled as its own chunk). Where the page has no Worker (the jsdom of the route tests), it
 * runs after a macrotask on the page itself, so the "Sizing…" state still shows first.
 */
import { computeSizing, type SizingReply, type SizingRequest } from './compute';

export interface SizingRun {
  answer: Promise<SizingReply>;
  /** stops a run whose answer is no longer wanted */
  cancel: () => void;
}

export function runSizing(request: SizingRequest): SizingRun {
  if (typeof Worker === 'undefined') {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const answer = new Promise<SizingReply>((resolve) => {
      timer = setTimeout(() => resolve(computeSizing(request)), 0);
    });
    return { answer, cancel: () => clearTimeout(timer) };
  }
  const worker = new Worker(new URL('../worker/sizing.worker.ts', import.meta.url), { type: 'module' });
  const answer = new Promise<SizingReply>((resolve) => {
    worker.onmessage = (event: MessageEvent<SizingReply>) => {
      resolve(event.data);
      worker.terminate();
    };
    worker.onerror = (event) => {
      resolve({ ok: false, code: 'worker', message: `The sizing could not run: ${event.message || 'the worker stopped'}`, elementId: null, millis: 0 });
      worker.terminate();
    };
  });
  worker.postMessage(request);
  return { answer, cancel: () => worker.terminate() };
}
