/**
 * The sizing off the page's thread: sizing the demo takes a few hundred milliseconds and a tall
 * building seconds, long enough to freeze typing and scrolling if it ran on the main thread.
 * One request per worker; the page ends the worker after the answer.
 */
import { computeSizing, type SizingRequest } from '../lib/compute';

self.onmessage = (event: MessageEvent<SizingRequest>) => {
  self.postMessage(computeSizing(event.data));
};
