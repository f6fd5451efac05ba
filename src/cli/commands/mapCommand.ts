/**
 * `undertone map <folder> --out <file.html>`: the concept map and the singular-value spectrum as
 * one self-contained offline HTML file (core/map/standaloneHtml.ts): page script, stylesheet and
 * data inlined, the file's concept vectors and a capped vocabulary embedded so its search box
 * places queries without any host, nothing fetched. Written atomically.
 * The page bundle (media/map/map.js, built by `npm run build`) and map.css are read from the
 * installed package: beside dist/ for the bundled CLI, found by walking up from this module.
 */
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { InvalidInputError, UndertoneError } from '../../core/errors.js';
import { DEFAULT_EMBEDDED_VOCABULARY_OPTIONS, embeddedSourceFromIndex } from '../../core/map/fromIndex.js';
import { buildEmbeddedQueryData } from '../../core/map/embeddedQueryData.js';
import { buildMapPageData } from '../../core/map/mapData.js';
import { computeMapLayouts } from '../../core/map/mapLayouts.js';
import { quickLayout } from '../../core/map/quickLayout.js';
import { buildStandaloneHtml } from '../../core/map/standaloneHtml.js';
import { DEFAULT_TOKENIZE_OPTIONS } from '../../core/text/tokenize.js';
import { findTopics } from '../../core/topics/topics.js';
import { folderMapSource } from '../../node/mapSource.js';
import { checkWritableFile, writeFileAtomic } from '../../node/persist.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatBytes, formatCount, type Io } from '../output.js';

export const MAP_LAYOUT_CHOICES = ['both', 'quick', 'faithful'] as const;
export type MapLayoutChoice = (typeof MAP_LAYOUT_CHOICES)[number];

export interface MapPageFiles {
  readonly script: string;
  readonly styles: string;
}

export async function mapCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  if (typeof flags.out !== 'string' || flags.out.trim().length === 0) {
    throw new InvalidInputError('map needs --out <file.html>, the HTML file to write (for example --out map.html)');
  }
  const out = resolve(flags.out);
  await checkWritableFile(out); // before the build, not after it
  const layout = parseLayout(flags.layout);
  const topicCount = positiveInt(flags.topics, 'topics');
  if (topicCount !== undefined && topicCount > 1000)
    throw new InvalidInputError(`--topics ${topicCount} is more than a legend can show; pick at most 1000`);
  const maxTerms = positiveInt(flags['max-terms'], 'max-terms') ?? DEFAULT_EMBEDDED_VOCABULARY_OPTIONS.maxTerms;
  const page = await readMapPage();
  const started = performance.now();
  const quiet = Boolean(flags.quiet);
  const stage = stageLine(io, quiet);

  const { index } = await ensureIndex(folder, flags, io);
  if (!quiet && JSON.stringify(index.settings.tokenize) !== JSON.stringify(DEFAULT_TOKENIZE_OPTIONS)) {
    io.err(
      'note: this index splits words with non-default settings; the map file’s search box uses the default tokenizer, so some words may not be found.',
    );
  }
  stage('finding topics');
  const topics = findTopics(index, { topics: topicCount, seed: index.settings.seed });
  stage('naming terms');
  const maxFileBytes = positiveInt(flags['max-file-size'], 'max-file-size');
  const source = await folderMapSource(folder, index, topics, maxFileBytes === undefined ? {} : { maxFileBytes });
  stage(`laying out ${formatCount(source.count)} files`);
  const layouts =
    layout === 'quick'
      ? { quick: quickLayout(source.vectors, source.count, source.dimensions), faithful: null }
      : computeMapLayouts(source.vectors, source.count, source.dimensions, { faithful: { seed: index.settings.seed } });
  stage('writing the page');
  const vocabulary = embeddedSourceFromIndex(index, source, layouts.quick, { maxTerms });
  const data = buildMapPageData(source, layouts, buildEmbeddedQueryData(vocabulary), {
    title: `Concept map · ${basename(resolve(folder))}`,
  });
  const bytes = Buffer.from(buildStandaloneHtml({ script: page.script, styles: page.styles, data }), 'utf8');
  await writeFileAtomic(out, bytes);
  stage(null);

  const seconds = (performance.now() - started) / 1000;
  const summary = {
    out,
    bytes: bytes.length,
    files: source.count,
    topics: source.topicLabels.length,
    layouts: layouts.faithful ? ['quick', 'faithful'] : ['quick'],
    searchTerms: vocabulary.terms.length,
    modelTerms: vocabulary.modelTerms,
    seconds: Math.round(seconds * 100) / 100,
  };
  if (flags.json) io.out(JSON.stringify(summary));
  else {
    const terms =
      summary.searchTerms < summary.modelTerms
        ? `${formatCount(summary.searchTerms)} of ${formatCount(summary.modelTerms)} terms`
        : `all ${formatCount(summary.modelTerms)} terms`;
    const layoutNames = `${summary.layouts.join(' + ')} layout${summary.layouts.length > 1 ? 's' : ''}`;
    io.out(
      `wrote ${out}: ${formatBytes(summary.bytes)}, ${plural(summary.files, 'file')}, ${plural(summary.topics, 'topic')}, ${layoutNames}, search knows ${terms} (${seconds.toFixed(2)} s)`,
    );
  }
  return 0;
}

function plural(n: number, noun: string): string {
  return `${formatCount(n)} ${noun}${n === 1 ? '' : 's'}`;
}

function parseLayout(value: unknown): MapLayoutChoice {
  if (value === undefined) return 'both';
  if (!MAP_LAYOUT_CHOICES.includes(value as MapLayoutChoice))
    throw new InvalidInputError(`--layout must be one of ${MAP_LAYOUT_CHOICES.join(', ')}, got "${String(value)}"`);
  return value as MapLayoutChoice;
}

/** A one-line stage indicator on stderr for terminals (null clears it). */
function stageLine(io: Io, quiet: boolean): (text: string | null) => void {
  let shown = false;
  return (text) => {
    if (quiet || !io.interactive) return;
    if (text === null) {
      if (shown) io.errRaw('\r\x1b[K');
    } else io.errRaw(`\r${text}…\x1b[K`);
    shown = text !== null;
  };
}

/**
 * The folder holding map.js and map.css: $UNDERTONE_MAP_PAGE_DIR when set, else media/map in the
 * nearest folder above this module that has one (dist/../media/map for the bundled CLI).
 */
export function mapPageDir(): string | undefined {
  const fromEnv = process.env.UNDERTONE_MAP_PAGE_DIR;
  if (fromEnv) return fromEnv;
  // In a CommonJS bundle (dist/cli.js) __dirname is the bundle's folder; from source, this module's.
  let dir = typeof __dirname === 'string' ? __dirname : undefined;
  for (let up = 0; dir && up < 5; up++) {
    const candidate = join(dir, 'media', 'map');
    if (existsSync(join(candidate, 'map.css'))) return candidate;
    const parent = dirname(dir);
    dir = parent === dir ? undefined : parent;
  }
  return undefined;
}

export async function readMapPage(dir = mapPageDir()): Promise<MapPageFiles> {
  const rebuild = 'Run `npm run build` in the Undertone folder first (it bundles the map page), then try again.';
  if (!dir) throw new UndertoneError(`cannot find the map page (media/map/map.css beside the installed program). ${rebuild}`);
  const read = async (name: string): Promise<string> => {
    const path = join(dir, name);
    if (!existsSync(path)) throw new UndertoneError(`the map page file ${path} is missing. ${rebuild}`);
    return readFile(path, 'utf8');
  };
  return { script: await read('map.js'), styles: await read('map.css') };
}
