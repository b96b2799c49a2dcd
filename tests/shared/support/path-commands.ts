/** Path data read back as commands, for comparing imported data number by number. */

/** One command: its letter and its numbers. */
export type Command = [string, ...number[]]

/** Absolute path data as commands (numbers may carry exponents; no command letter is an e). */
export function commandsOf(data: string): Command[] {
  const commands: Command[] = []
  for (const token of data.match(/[MLHVCSQTAZ]|[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/g) ?? []) {
    if (/[A-Z]/.test(token)) commands.push([token])
    else commands[commands.length - 1].push(Number(token))
  }
  return commands
}
