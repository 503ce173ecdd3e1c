// Runs `freshet office …` directly: node --import tsx office/receiver/main.ts [arguments after "office"].
import { runOffice } from './cli';

process.exitCode = await runOffice(process.argv.slice(2));
