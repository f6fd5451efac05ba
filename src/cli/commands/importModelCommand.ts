/**
 * `undertone import-model <folder> --model FILE`: makes the folder's index fold its files into a
 * shared concept model (one file, written by the cluster job in cluster/ or by another machine)
 * instead of decomposing its own matrix; the saved index remembers the model, so later commands
 * and refreshes keep using it (a changed model file is picked up and refolded). `--model none`
 * goes back to a local SVD. The editor's setting undertone.conceptModel does the same.
 */
import { InvalidInputError } from '../../core/errors.js';
import { ensureIndex, type Flags } from '../context.js';
import { formatCount, type Io } from '../output.js';

export async function importModelCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  if (typeof flags.model !== 'string' || flags.model.length === 0)
    throw new InvalidInputError('import-model needs --model FILE (a concept model file), or --model none for a local SVD');
  const report = await ensureIndex(folder, { ...flags, quiet: true }, io, { force: true });
  const index = report.index;
  const shared = index.settings.sharedModel;
  const m = index.model;
  const summary = {
    model: shared?.path ?? null,
    modelKey: shared?.key ?? null,
    k: m.k,
    modelTerms: m.keptIds.length,
    files: report.files,
    nonZeros: m.nonZeros,
    meanResidual: m.residualMean,
  };
  if (flags.json) io.out(JSON.stringify(summary));
  else if (!flags.quiet) {
    io.err(
      shared
        ? `folded ${formatCount(report.files)} files into the shared concept model ${shared.path} (k=${m.k}, ${formatCount(m.keptIds.length)} terms); ` +
            `on average ${((1 - m.residualMean) * 100).toFixed(1)}% of a file's weight lies in its concepts`
        : `back to a local SVD: ${formatCount(report.files)} files, k=${m.k}`,
    );
  }
  return 0;
}
