/**
 * ‖μ‖² for μ the mean of the occupied slots' rows (k numbers each): the chance level of a word's
 * focus (termFocus.ts) needs it for every search. The sum is kept in blocks of BLOCK consecutive
 * occupied slots (each block's rows added in slot order, the blocks' sums then added in order), so
 * after an edit only the blocks whose slots changed are added again: a saved file keeps its slot
 * (one block, about 0.2 M additions instead of 15.6 M on the Linux tree's 78,300 files at
 * k = 200), a new file joins the last block, a removal shifts the blocks after it. The blocks are
 * cut from the occupied slots in order, not from slot numbers, so an index saved without its holes
 * and opened again adds the same rows in the same order: the same bits as the live one. Blocked
 * partial sums are common practice; BLOCK only sets how much one edit adds again.
 */
import { addRows } from './termFocus.js';

/** Occupied slots a block (our choice: about 0.8 MB of rows added again per edit at k = 200). */
export const MEAN_ROW_BLOCK = 1024;

export class MeanRow {
  /** Each block's slots, and the sum of their rows (k numbers). */
  private blocks: { slots: Int32Array; sum: Float64Array }[] = [];
  /** Slots whose rows changed since the last read. */
  private readonly touchedSlots = new Set<number>();
  /** Whether a slot was filled or emptied since the last read (the blocks are then cut again). */
  private occupancyChanged = true;
  /** Each slot's block at the last read (−1: empty), the slot count and the occupied count then. */
  private blockOf = new Int32Array(0);
  private n = -1;
  private m = 0;
  private value = -1;

  constructor(
    private readonly k: number,
    private readonly block = MEAN_ROW_BLOCK,
  ) {}

  /**
   * A slot's row changed; inPlace when it was occupied before and still is (a saved file), so the
   * blocks keep their slots and the next read adds only the touched blocks again without cutting
   * the blocks anew.
   */
  touched(slot: number, inPlace = false): void {
    this.touchedSlots.add(slot);
    if (!inPlace) this.occupancyChanged = true;
    this.value = -1;
  }

  /** ‖mean of the rows of the slots `occupied` says are in use, among the first n‖² (0 when none). */
  normSquared(rows: Float32Array, n: number, occupied: (slot: number) => boolean): number {
    if (this.value >= 0) return this.value;
    if (!this.occupancyChanged && n === this.n) return this.readInPlace(rows);
    const k = this.k;
    const order = new Int32Array(n);
    let m = 0;
    for (let j = 0; j < n; j++) if (occupied(j)) order[m++] = j;
    const blocks: { slots: Int32Array; sum: Float64Array }[] = [];
    const total = new Float64Array(k);
    for (let b = 0, start = 0; start < m; b++, start += this.block) {
      const slots = order.slice(start, Math.min(m, start + this.block));
      const old = this.blocks[b];
      let kept = old !== undefined && sameSlots(old.slots, slots);
      for (let i = 0; kept && i < slots.length; i++) if (this.touchedSlots.has(slots[i])) kept = false;
      let sum = kept ? old.sum : null;
      if (!sum) {
        sum = new Float64Array(k);
        addRows(rows, k, slots, slots.length, sum);
      }
      blocks.push({ slots, sum });
      for (let c = 0; c < k; c++) total[c] += sum[c];
    }
    this.blocks = blocks;
    this.touchedSlots.clear();
    this.occupancyChanged = false;
    this.n = n;
    this.m = m;
    if (this.blockOf.length < n) this.blockOf = new Int32Array(n);
    this.blockOf.fill(-1);
    blocks.forEach((b, i) => b.slots.forEach((j) => (this.blockOf[j] = i)));
    return this.finish(total);
  }

  /** The same blocks as at the last read: adds the touched ones again, then every block's sum in order. */
  private readInPlace(rows: Float32Array): number {
    const k = this.k;
    const again = new Set<number>();
    for (const j of this.touchedSlots) again.add(this.blockOf[j]);
    for (const b of again) {
      const block = this.blocks[b];
      block.sum = new Float64Array(k);
      addRows(rows, k, block.slots, block.slots.length, block.sum);
    }
    this.touchedSlots.clear();
    const total = new Float64Array(k);
    for (const { sum } of this.blocks) for (let c = 0; c < k; c++) total[c] += sum[c];
    return this.finish(total);
  }

  private finish(total: Float64Array): number {
    let ss = 0;
    for (let c = 0; c < this.k; c++) ss += (total[c] / Math.max(this.m, 1)) ** 2;
    this.value = ss;
    return ss;
  }
}

function sameSlots(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
