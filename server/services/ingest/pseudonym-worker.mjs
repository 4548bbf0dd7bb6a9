// Entry of the pseudonym worker thread (pseudonym-thread.ts). Workers start without the parent's
// loader flags, so TypeScript support is registered here before the worker's code is loaded.
import { register } from 'tsx/esm/api';

register();
await import('./pseudonym-worker-main.ts');
