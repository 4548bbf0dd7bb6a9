// Entry of an analyzer worker thread (analyzer-pool.ts). Workers start without the parent's
// loader flags, so TypeScript support is registered here before the analyzer is loaded.
import { register } from 'tsx/esm/api';

register();
await import('./analyzer-worker-main.ts');
