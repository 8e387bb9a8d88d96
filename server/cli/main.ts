// `npm run -s cli -- <command> ...`: the command-line tools. One line per command below.
// A command returns its exit code (nothing = 0); a CliUsageError exits 2, anything else 1,
// always with a one-line message and never a stack trace.
import { runFoundryCli } from './foundry';
import { runAssemble, runDeduce } from './puzzle';
import { CliUsageError, runNetwork, runSolve, runVerify } from './tiling';

type Command = (argv: readonly string[], write: (s: string) => void) => void | number | Promise<void | number>;

const commands: Record<string, Command> = {
  foundry: runFoundryCli,
  verify: runVerify,
  network: runNetwork,
  solve: runSolve,
  assemble: runAssemble,
  deduce: runDeduce,
};

const [name, ...rest] = process.argv.slice(2);
const command = name ? commands[name] : undefined;
if (!command) {
  process.stderr.write(`usage: npm run -s cli -- <${Object.keys(commands).join('|')}> ...\n`);
  process.exit(2);
}
try {
  const code = await command(rest, (s) => process.stdout.write(`${s}\n`));
  process.exitCode = typeof code === 'number' ? code : 0;
} catch (e) {
  process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(e instanceof CliUsageError ? 2 : 1);
}
