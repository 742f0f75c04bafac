// BullMQ starts sandboxed processors in fresh worker threads, which do not
// inherit the TypeScript loader of the parent process: take the prebuilt
// bundle when it is current, else register the loader and use the source.
import { importEntry } from '../prebuilt/load.mjs';

const { default: processJob } = await importEntry('processor');

export default processJob;
