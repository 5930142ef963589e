// The worker thread's entry: plain JavaScript that teaches Node TypeScript (tsx, a dependency of
// the server) and then loads the validator, so the same worker runs under `npm start`, the test
// runner and Vitest alike.
import { register } from 'tsx/esm/api';

register();
const worker = await import('./validateWorker.ts');
export default worker.default;
