#!/usr/bin/env node
// The `plotgauge` bin: runs the TypeScript command line through tsx's loader.
import { register } from 'tsx/esm/api';

register();
const { runCli } = await import('../server/main.ts');
const code = await runCli(process.argv.slice(2));
if (code !== 0) process.exit(code);
