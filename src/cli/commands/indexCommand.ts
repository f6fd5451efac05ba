/** `undertone index <folder>`: build or refresh the saved index and say what was done. */
import { ensureIndex, type Flags } from '../context.js';
import { printable, type Io } from '../output.js';

export async function indexCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const report = await ensureIndex(folder, flags, io, { force: Boolean(flags.rebuild), summary: true });
  if (flags.json) {
    const { index: _index, ...rest } = report;
    io.out(JSON.stringify(rest));
  }
  if (report.saveProblem) {
    // Saving is this command's whole job: the index was built, but nothing was kept.
    io.err(`undertone index: the index was built but not saved: ${printable(report.saveProblem)}`);
    return 1;
  }
  return 0;
}
