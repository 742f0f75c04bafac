#!/usr/bin/env node
// The command-line entry: the engine is TypeScript, run through the tsx loader.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../server/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
