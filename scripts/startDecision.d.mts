// Types of scripts/startDecision.mjs for the TypeScript tests.
export const RUNTIME_MISSING_MESSAGE: string;
export type Env = Record<string, string | undefined>;
export function electronRuntimePath(electronDir: string, env: Env): string | null;
export function runElectronInstaller(electronDir: string, env: Env): number | null;
export function decideStart(options: {
  electronDir: string;
  env: Env;
  install?: (electronDir: string, env: Env) => number | null;
  log?: (line: string) => void;
}):
  | { action: 'launch'; binary: string; installed: boolean }
  | { action: 'explain'; message: string; installerStatus: number | null };
