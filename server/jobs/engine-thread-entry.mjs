// The engine thread a job starts does not inherit the TypeScript loader of
// its parent thread: take the prebuilt bundle when it is current, else
// register the loader and run the engine's side from the source.
import { importEntry } from '../prebuilt/load.mjs';

await importEntry('engine-thread');
