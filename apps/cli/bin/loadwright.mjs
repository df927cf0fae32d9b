#!/usr/bin/env node
// Runs the TypeScript entry point through tsx so the command needs no build step.
import { register } from 'tsx/esm/api';
register({ tsconfig: new URL('../../../tsconfig.json', import.meta.url).pathname });
await import('../src/main.ts');
