#!/usr/bin/env node
// The office command line: registers tsx (a dependency) so Node can load the TypeScript sources, then
// hands the arguments to the dispatcher in office/cli.
import { register } from 'tsx/esm/api';

register();
const { run } = await import('../office/cli/index.ts');
process.exitCode = await run(process.argv.slice(2));
