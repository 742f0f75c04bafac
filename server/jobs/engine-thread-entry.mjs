// The engine thread a job starts does not inherit the TypeScript loader of
// its parent thread: register it here, then run the engine's side in TypeScript.
import { register } from 'tsx/esm/api';

register();
await import('./engine-thread.ts');
