/**
 * A spill held in a growing array in memory (the node side is a scratch file beside the index:
 * src/node/sectionCodeFile.ts), counting how many were opened and closed. Shared by the tests of
 * the parked matrix (test/core/matrix/parkedMatrix.test.ts) and the spilled section rows
 * (test/core/sections/sectionVectors.test.ts).
 */
import type { ByteSpill, OpenSpill } from '../../src/core/sections/types.js';

export interface MemorySpill {
  readonly open: OpenSpill;
  /** Spills opened so far. */
  opened(): number;
  /** Spills closed (given back) so far. */
  closes(): number;
}

export function memorySpill(): MemorySpill {
  let opened = 0;
  let closes = 0;
  const open: OpenSpill = () => {
    opened++;
    let bytes = new Uint8Array(0);
    const spill: ByteSpill = {
      write: (b, at) => {
        if (at + b.length > bytes.length) {
          const grown = new Uint8Array(at + b.length);
          grown.set(bytes);
          bytes = grown;
        }
        bytes.set(b, at);
      },
      read: (into, at) => into.set(bytes.subarray(at, at + into.length)),
      close: () => void closes++,
    };
    return spill;
  };
  return { open, opened: () => opened, closes: () => closes };
}
