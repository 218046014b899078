/**
 * The traversal kernel for forests with categorical nodes on features of more than
 * 31 values: the integer row block holds code + 1 (0: missing; 0 in numeric
 * slots) and each categorical node owns a bitset region of the codes (+1) that go
 * right, bit 0 being the missing direction; numeric nodes point at an all-zero
 * region, categorical ones have threshold +Infinity, so one branchless expression
 * serves both. Eight trees in lockstep; output as traverseNumeric.
 *
 * @example
 * traverseBitset(f.offset, f.threshold, f.bitsStart, f.bits, f.codeMask, f.nodes, f.depth, f.treeCount, block, codes, stride, rows, slots, trees, 0, 0, f.leaves);
 */
export function traverseBitset(
  offset: Int32Array,
  threshold: Float64Array,
  bitsStart: Int32Array,
  bits: Int32Array,
  codeMask: number,
  nodes: number,
  depth: number,
  treeCount: number,
  block: Float64Array,
  codes: Int32Array,
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
      let j = 0;
      let s = 0;
      let c = 0;
      for (let d = 0; d < depth; d++) {
        j = b0 + n0;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n0 =
          2 * n0 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b1 + n1;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n1 =
          2 * n1 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b2 + n2;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n2 =
          2 * n2 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b3 + n3;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n3 =
          2 * n3 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b4 + n4;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n4 =
          2 * n4 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b5 + n5;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n5 =
          2 * n5 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b6 + n6;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n6 =
          2 * n6 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b7 + n7;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n7 =
          2 * n7 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
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
      let j = 0;
      let s = 0;
      let c = 0;
      for (let d = 0; d < depth; d++) {
        j = b0 + n0;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n0 =
          2 * n0 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b1 + n1;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n1 =
          2 * n1 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b2 + n2;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n2 =
          2 * n2 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
        j = b3 + n3;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n3 =
          2 * n3 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
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
      let j = 0;
      let s = 0;
      let c = 0;
      for (let d = 0; d < depth; d++) {
        j = b0 + n0;
        s = r + offset[j];
        c = codes[s] & codeMask;
        n0 =
          2 * n0 +
          1 +
          (+(block[s] > threshold[j]) | ((bits[bitsStart[j] + (c >>> 5)] >>> (c & 31)) & 1));
      }
      out[o] = first + n0;
    }
  }
}
