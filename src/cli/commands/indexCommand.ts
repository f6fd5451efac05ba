/** `undertone index <folder>`: build or refresh the saved index and say what was done. */
import { ensureIndex, type Flags } from '../context.js';
import type { Io } from '../output.js';

export async function indexCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const report = await ensureIndex(folder, { ...flags, quiet: false }, io, { force: Boolean(flags.rebuild), summary: true });
  if (flags.json) {
    const { index: _index, ...rest } = report;
    io.out(JSON.stringify(rest));
  }
  return 0;
}
