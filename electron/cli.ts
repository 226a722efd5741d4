/**
 * `whistlemark <command> ...`: one module per command under electron/cli/, each exporting
 * `run(args) -> exit code`. Commands use the same importers and engine as the app.
 */
export interface CliCommand {
  /** One line for `whistlemark help`. */
  summary: string;
  usage: string;
  run(args: string[]): Promise<number>;
}

// Loaded on demand so one command's dependencies never slow another's start.
const commandModules: Record<string, string> = {
  inspect: './cli/inspect.ts',
  sync: './cli/sync.ts',
  whistles: './cli/whistles.ts',
  cuts: './cli/cuts.ts',
  export: './cli/export.ts',
};
const commands: Record<string, () => Promise<{ command: CliCommand }>> = Object.fromEntries(
  Object.entries(commandModules).map(([name, rel]) => [name, () => import(new URL(rel, import.meta.url).href)]),
);

export async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === 'help' || name === '--help' || name === '-h') {
    const lines = ['usage: whistlemark <command> [options]', '', 'commands:'];
    for (const [n, load] of Object.entries(commands)) {
      const cmd = await load().then((m) => m.command).catch(() => null);
      if (cmd) lines.push(`  ${n.padEnd(10)} ${cmd.summary}`);
    }
    console.log(lines.join('\n'));
    return name ? 0 : 2;
  }
  const load = commands[name];
  if (!load) {
    console.error(`whistlemark: unknown command "${name}". Run "whistlemark help" for the list.`);
    return 2;
  }
  const { command } = await load();
  if (rest.includes('--help') || rest.includes('-h')) {
    console.log(command.usage);
    return 0;
  }
  try {
    return await command.run(rest);
  } catch (err) {
    console.error(`whistlemark ${name}: ${err instanceof Error ? err.message : String(err)}`);
    return 1;
  }
}
