// `npm run -s cli -- <command> ...`: the command-line tools. One line per command below.
import { runFoundryCli } from './foundry';

const commands: Record<string, (argv: readonly string[], write: (s: string) => void) => void | Promise<void>> = {
  foundry: runFoundryCli,
};

const [name, ...rest] = process.argv.slice(2);
const command = name ? commands[name] : undefined;
if (!command) {
  process.stderr.write(`usage: npm run -s cli -- <${Object.keys(commands).join('|')}> ...\n`);
  process.exit(2);
}
try {
  await command(rest, (s) => process.stdout.write(`${s}\n`));
} catch (e) {
  process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
}
