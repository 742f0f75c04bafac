#!/usr/bin/env node
// The command-line entry: the prebuilt bundle when it matches the sources,
// else the TypeScript engine through the tsx loader.
import { importEntry } from '../server/prebuilt/load.mjs';

const { main } = await importEntry('cli');
process.exitCode = await main(process.argv.slice(2));
