// BullMQ starts sandboxed processors in fresh worker threads, which do not
// inherit the TypeScript loader of the parent process: register it here,
// then hand over to the processor written in TypeScript.
import { register } from 'tsx/esm/api';

register();
const { default: processJob } = await import('./processor.ts');

export default processJob;
