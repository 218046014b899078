/**
 * The heads kernel over reached leaves: for each row i, z[i * lanes + h] = the sum
 * over trees t of weight[slots[i * treeCount + t] * lanes + h]. The lanes of a
 * leaf's weights are summed in registers, with one loop per lane count (2, 4, 6,
 * 8; beyond that groups of 8), so each leaf's weights are read once for all heads.
 * Trees are taken `group` at a time over all rows, so that the group's weights
 * stay in cache (a big forest's table does not); the sum runs in tree order
 * either way, so every lane count and group gives the same roundings.
 *
 * Two trees per step halve the loop's own work, and slots are masked with
 * 0xfffffff (2^28 - 1, a literal: a module constant costs a context load): an
 * encoded leaf index is far below it (the leaf table is capped at 1 GiB, see
 * checkTableSize), so the mask changes nothing but lets the compiler drop the
 * overflow checks on `slot * lanes + h`; together they cut the kernel's time by
 * about a seventh here.
 *
 * @example
 * sumLeafWeights(slots, 100, rows, heads.leafWeight, heads.lanes, 32, z);
 */
export function sumLeafWeights(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  group: number,
  z: Float64Array,
): void {
  if (lanes === 2) sumLanes2(slots, treeCount, count, weight, group, z);
  else if (lanes === 4) sumLanes4(slots, treeCount, count, weight, group, z);
  else if (lanes === 6) sumLanes6(slots, treeCount, count, weight, group, z);
  else sumLanes8(slots, treeCount, count, weight, lanes, group, z);
}

function sumLanes2(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 2);
  for (let from = 0; from < treeCount; from += group) {
    const to = from + group < treeCount ? from + group : treeCount;
    for (let i = 0; i < count; i++) {
      const zo = i * 2;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      const end = i * treeCount + to;
      let t = i * treeCount + from;
      for (; t + 1 < end; t += 2) {
        const g = (slots[t] & 0xfffffff) * 2;
        const k = (slots[t + 1] & 0xfffffff) * 2;
        z0 += weight[g];
        z0 += weight[k];
        z1 += weight[g + 1];
        z1 += weight[k + 1];
      }
      if (t < end) {
        const g = (slots[t] & 0xfffffff) * 2;
        z0 += weight[g];
        z1 += weight[g + 1];
      }
      z[zo + 0] = z0;
      z[zo + 1] = z1;
    }
  }
}

function sumLanes4(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 4);
  for (let from = 0; from < treeCount; from += group) {
    const to = from + group < treeCount ? from + group : treeCount;
    for (let i = 0; i < count; i++) {
      const zo = i * 4;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      let z2 = z[zo + 2];
      let z3 = z[zo + 3];
      const end = i * treeCount + to;
      let t = i * treeCount + from;
      for (; t + 1 < end; t += 2) {
        const g = (slots[t] & 0xfffffff) * 4;
        const k = (slots[t + 1] & 0xfffffff) * 4;
        z0 += weight[g];
        z0 += weight[k];
        z1 += weight[g + 1];
        z1 += weight[k + 1];
        z2 += weight[g + 2];
        z2 += weight[k + 2];
        z3 += weight[g + 3];
        z3 += weight[k + 3];
      }
      if (t < end) {
        const g = (slots[t] & 0xfffffff) * 4;
        z0 += weight[g];
        z1 += weight[g + 1];
        z2 += weight[g + 2];
        z3 += weight[g + 3];
      }
      z[zo + 0] = z0;
      z[zo + 1] = z1;
      z[zo + 2] = z2;
      z[zo + 3] = z3;
    }
  }
}

function sumLanes6(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 6);
  for (let from = 0; from < treeCount; from += group) {
    const to = from + group < treeCount ? from + group : treeCount;
    for (let i = 0; i < count; i++) {
      const zo = i * 6;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      let z2 = z[zo + 2];
      let z3 = z[zo + 3];
      let z4 = z[zo + 4];
      let z5 = z[zo + 5];
      const end = i * treeCount + to;
      let t = i * treeCount + from;
      for (; t + 1 < end; t += 2) {
        const g = (slots[t] & 0xfffffff) * 6;
        const k = (slots[t + 1] & 0xfffffff) * 6;
        z0 += weight[g];
        z0 += weight[k];
        z1 += weight[g + 1];
        z1 += weight[k + 1];
        z2 += weight[g + 2];
        z2 += weight[k + 2];
        z3 += weight[g + 3];
        z3 += weight[k + 3];
        z4 += weight[g + 4];
        z4 += weight[k + 4];
        z5 += weight[g + 5];
        z5 += weight[k + 5];
      }
      if (t < end) {
        const g = (slots[t] & 0xfffffff) * 6;
        z0 += weight[g];
        z1 += weight[g + 1];
        z2 += weight[g + 2];
        z3 += weight[g + 3];
        z4 += weight[g + 4];
        z5 += weight[g + 5];
      }
      z[zo + 0] = z0;
      z[zo + 1] = z1;
      z[zo + 2] = z2;
      z[zo + 3] = z3;
      z[zo + 4] = z4;
      z[zo + 5] = z5;
    }
  }
}

/** Eight lanes at a time; `lanes` is a multiple of 8. */
function sumLanes8(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * lanes);
  for (let from = 0; from < treeCount; from += group) {
    const to = from + group < treeCount ? from + group : treeCount;
    for (let i = 0; i < count; i++) {
      const o = i * treeCount;
      for (let h = 0; h < lanes; h += 8) {
        const zo = i * lanes + h;
        let z0 = z[zo];
        let z1 = z[zo + 1];
        let z2 = z[zo + 2];
        let z3 = z[zo + 3];
        let z4 = z[zo + 4];
        let z5 = z[zo + 5];
        let z6 = z[zo + 6];
        let z7 = z[zo + 7];
        for (let t = o + from; t < o + to; t++) {
          const g = (slots[t] & 0xfffffff) * lanes + h;
          z0 += weight[g];
          z1 += weight[g + 1];
          z2 += weight[g + 2];
          z3 += weight[g + 3];
          z4 += weight[g + 4];
          z5 += weight[g + 5];
          z6 += weight[g + 6];
          z7 += weight[g + 7];
        }
        z[zo] = z0;
        z[zo + 1] = z1;
        z[zo + 2] = z2;
        z[zo + 3] = z3;
        z[zo + 4] = z4;
        z[zo + 5] = z5;
        z[zo + 6] = z6;
        z[zo + 7] = z7;
      }
    }
  }
}
