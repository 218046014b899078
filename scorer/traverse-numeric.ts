/**
 * The traversal kernel for forests without categorical nodes: eight trees walked in
 * lockstep per row (independent load chains keep the CPU busy; then four, then
 * one for the last trees), each group of trees over all rows before the next
 * (its nodes stay in L1; a big forest does not fit in L2), branchless
 * (`child = 2i + 1 + (x > threshold)`), the missing direction folded into which
 * slot of the row block a node reads (see InputPlan).
 *
 * Writes, for row i and tree t, `leafBase + t * leafStride + leaf` to
 * `out[i * outStride + outOffset + t]`. The forest's arrays come in as
 * parameters: read from an object inside the kernel they cost about a third
 * more here.
 *
 * @example
 * traverseNumeric(f.offset, f.threshold, f.nodes, f.depth, f.treeCount, block, stride, rows, slots, trees, 0, leafBase, f.leaves);
 */
export function traverseNumeric(
  offset: Int32Array,
  threshold: Float64Array,
  nodes: number,
  depth: number,
  treeCount: number,
  block: Float64Array,
  stride: number,
  count: number,
  out: Int32Array,
  outStride: number,
  outOffset: number,
  leafBase: number,
  leafStride: number,
): void {
  let t = 0;
  for (; t + 8 <= treeCount; t += 8) {
    const b0 = t * nodes;
    const b1 = b0 + nodes;
    const b2 = b1 + nodes;
    const b3 = b2 + nodes;
    const b4 = b3 + nodes;
    const b5 = b4 + nodes;
    const b6 = b5 + nodes;
    const b7 = b6 + nodes;
    const first = leafBase + t * leafStride - nodes;
    for (let i = 0; i < count; i++) {
      const r = i * stride;
      const o = i * outStride + outOffset + t;
      let n0 = 0;
      let n1 = 0;
      let n2 = 0;
      let n3 = 0;
      let n4 = 0;
      let n5 = 0;
      let n6 = 0;
      let n7 = 0;
      for (let d = 0; d < depth; d++) {
        n0 = 2 * n0 + 1 + +(block[r + offset[b0 + n0]] > threshold[b0 + n0]);
        n1 = 2 * n1 + 1 + +(block[r + offset[b1 + n1]] > threshold[b1 + n1]);
        n2 = 2 * n2 + 1 + +(block[r + offset[b2 + n2]] > threshold[b2 + n2]);
        n3 = 2 * n3 + 1 + +(block[r + offset[b3 + n3]] > threshold[b3 + n3]);
        n4 = 2 * n4 + 1 + +(block[r + offset[b4 + n4]] > threshold[b4 + n4]);
        n5 = 2 * n5 + 1 + +(block[r + offset[b5 + n5]] > threshold[b5 + n5]);
        n6 = 2 * n6 + 1 + +(block[r + offset[b6 + n6]] > threshold[b6 + n6]);
        n7 = 2 * n7 + 1 + +(block[r + offset[b7 + n7]] > threshold[b7 + n7]);
      }
      out[o] = first + n0;
      out[o + 1] = first + 1 * leafStride + n1;
      out[o + 2] = first + 2 * leafStride + n2;
      out[o + 3] = first + 3 * leafStride + n3;
      out[o + 4] = first + 4 * leafStride + n4;
      out[o + 5] = first + 5 * leafStride + n5;
      out[o + 6] = first + 6 * leafStride + n6;
      out[o + 7] = first + 7 * leafStride + n7;
    }
  }
  for (; t + 4 <= treeCount; t += 4) {
    const b0 = t * nodes;
    const b1 = b0 + nodes;
    const b2 = b1 + nodes;
    const b3 = b2 + nodes;
    const first = leafBase + t * leafStride - nodes;
    for (let i = 0; i < count; i++) {
      const r = i * stride;
      const o = i * outStride + outOffset + t;
      let n0 = 0;
      let n1 = 0;
      let n2 = 0;
      let n3 = 0;
      for (let d = 0; d < depth; d++) {
        n0 = 2 * n0 + 1 + +(block[r + offset[b0 + n0]] > threshold[b0 + n0]);
        n1 = 2 * n1 + 1 + +(block[r + offset[b1 + n1]] > threshold[b1 + n1]);
        n2 = 2 * n2 + 1 + +(block[r + offset[b2 + n2]] > threshold[b2 + n2]);
        n3 = 2 * n3 + 1 + +(block[r + offset[b3 + n3]] > threshold[b3 + n3]);
      }
      out[o] = first + n0;
      out[o + 1] = first + 1 * leafStride + n1;
      out[o + 2] = first + 2 * leafStride + n2;
      out[o + 3] = first + 3 * leafStride + n3;
    }
  }
  for (; t < treeCount; t++) {
    const b0 = t * nodes;
    const first = leafBase + t * leafStride - nodes;
    for (let i = 0; i < count; i++) {
      const r = i * stride;
      const o = i * outStride + outOffset + t;
      let n0 = 0;
      for (let d = 0; d < depth; d++) {
        n0 = 2 * n0 + 1 + +(block[r + offset[b0 + n0]] > threshold[b0 + n0]);
      }
      out[o] = first + n0;
    }
  }
}
