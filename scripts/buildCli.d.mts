// Types of scripts/buildCli.mjs for the TypeScript tests and benchmarks.
export function buildCli(options?: {
  outdir?: string;
  logLevel?: 'verbose' | 'debug' | 'info' | 'warning' | 'error' | 'silent';
}): Promise<string>;
