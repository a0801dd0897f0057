#!/usr/bin/env node
/**
 * Entry of the fragplan command line. For `plan` it starts the worker threads first, so that they
 * boot while the commands, the config and the pipeline load (see src/cli/commands.ts); everything
 * else is loaded after that.
 */
import { earlyPlanPools } from './cli/early-pools.js';

const early = earlyPlanPools(process.argv.slice(2));
const { runCli } = await import('./cli/commands.js');
await runCli(early);
