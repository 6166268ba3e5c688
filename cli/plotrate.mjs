#!/usr/bin/env node
// The `plotrate` command: loads the TypeScript entry point through tsx.
import { register } from 'tsx/esm/api';

register();
await import('./main.ts');
