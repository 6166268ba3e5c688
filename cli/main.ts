// Entry point of the `plotrate` command line: parse, dispatch, and turn every
// failure into one line on stderr and an exit code (0 done, 1 analysis failed,
// 2 bad input or usage).
import { readFileSync } from 'node:fs';
import { isImportError } from '../shared/import/importError';
import type { Console2 } from './analyzeCommand';
import { helpText } from './helpText';
import { parseArgs } from './parseArgs';
import { UsageError } from './usageError';

const version = (
  JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as {
    version: string;
  }
).version;

const log: Console2 = {
  out: (line) => process.stdout.write(`${line}\n`),
  // Every message is one line, whatever a cell it quotes holds: a reader of the log (or a
  // script) can take each line as one message.
  err: (line) => process.stderr.write(`${oneLine(line)}\n`),
};

/** One line: the reason, with no stack (the user can act on the message). */
function oneLine(text: string): string {
  return text.replace(/\s*\n\s*/g, ' ').trim();
}

async function main(argv: string[]): Promise<number> {
  try {
    const cmd = parseArgs(argv);
    if (cmd.command === 'help') {
      process.stdout.write(helpText(version));
      return 0;
    }
    if (cmd.command === 'version') {
      log.out(version);
      return 0;
    }
    if (cmd.command === 'demo') {
      // Loaded only here: the demo writes a workbook, so it brings exceljs with it.
      const { demoCommand } = await import('./demoCommand');
      await demoCommand(cmd.dir, log, version);
      return 0;
    }
    // Loaded only for a run: --help and --version then start without the analysis code.
    const { analyzeCommand } = await import('./analyzeCommand');
    await analyzeCommand(cmd, log, version);
    return 0;
  } catch (e) {
    if (e instanceof UsageError) {
      log.err(`plotrate: ${oneLine(e.message)}`);
      return 2;
    }
    if (isImportError(e)) {
      const where = e.where
        ? [e.where.file, e.where.sheet, e.where.cell].filter(Boolean).join(' › ')
        : '';
      const msg = oneLine(e.message);
      // The message usually names the place already; add it only when it does not.
      log.err(
        `plotrate: ${where && !msg.includes(e.where?.cell ?? '\u0000') && !msg.includes(e.where?.file ?? '\u0000') ? `${where}: ` : ''}${msg}`,
      );
      return 2;
    }
    // By name, as isImportError does: the class lives in the lazily loaded analyzeCommand.
    if (e instanceof Error && e.name === 'AnalysisFailed') {
      log.err(`plotrate: analysis failed: ${oneLine(e.message)}`);
      return 1;
    }
    if (e instanceof Error && e.name === 'OutputFailed') {
      log.err(`plotrate: ${oneLine(e.message)}`);
      return 1;
    }
    log.err(`plotrate: analysis failed: ${oneLine(e instanceof Error ? e.message : String(e))}`);
    if (process.env.PLOTRATE_DEBUG && e instanceof Error) process.stderr.write(`${e.stack}\n`);
    return 1;
  }
}

let stopping = false;
// An interrupted run removes the outputs' temporary files before it ends (none was renamed
// yet, so every target is as it was). Exit codes as a shell reports a signal: 128 + its number.
for (const [signal, code] of [
  ['SIGINT', 130],
  ['SIGTERM', 143],
] as const) {
  process.on(signal, () => {
    // A second signal (a second Ctrl-C) while the first is handled changes nothing.
    if (stopping) return;
    stopping = true;
    void import('../electron/atomicWrite').then(({ removeLiveTemporaries }) => {
      removeLiveTemporaries();
      log.err(`plotrate: stopped by ${signal}; unfinished outputs removed.`);
      process.exit(code);
    });
  });
}

process.exitCode = await main(process.argv.slice(2));
