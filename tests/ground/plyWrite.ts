/** Test fixtures: binary little-endian PLY writers (Turk 1994 format) for meshes and point clouds. */
export function plyMesh(positions: Float32Array, indices: Uint32Array): Uint8Array {
  const nv = positions.length / 3;
  const nt = indices.length / 3;
  const header = `ply\nformat binary_little_endian 1.0\ncomment invented test ground\nelement vertex ${nv}\nproperty float x\nproperty float y\nproperty float z\nelement face ${nt}\nproperty list uchar int vertex_indices\nend_header\n`;
  const hb = new TextEncoder().encode(header);
  const out = new Uint8Array(hb.length + nv * 12 + nt * 13);
  out.set(hb);
  const dv = new DataView(out.buffer);
  let o = hb.length;
  for (let i = 0; i < nv * 3; i++, o += 4) dv.setFloat32(o, positions[i], true);
  for (let t = 0; t < nt; t++) {
    dv.setUint8(o, 3);
    dv.setInt32(o + 1, indices[3 * t], true);
    dv.setInt32(o + 5, indices[3 * t + 1], true);
    dv.setInt32(o + 9, indices[3 * t + 2], true);
    o += 13;
  }
  return out;
}

export function plyPoints(positions: Float32Array | Float64Array, ascii = false): Uint8Array {
  const nv = positions.length / 3;
  if (ascii) {
    const lines = [`ply`, `format ascii 1.0`, `element vertex ${nv}`, `property double x`, `property double y`, `property double z`, `end_header`];
    for (let i = 0; i < nv; i++) lines.push(`${positions[3 * i]} ${positions[3 * i + 1]} ${positions[3 * i + 2]}`);
    return new TextEncoder().encode(lines.join('\n') + '\n');
  }
  const header = `ply\nformat binary_little_endian 1.0\nelement vertex ${nv}\nproperty double x\nproperty double y\nproperty double z\nend_header\n`;
  const hb = new TextEncoder().encode(header);
  const out = new Uint8Array(hb.length + nv * 24);
  out.set(hb);
  const dv = new DataView(out.buffer);
  let o = hb.length;
  for (let i = 0; i < nv * 3; i++, o += 8) dv.setFloat64(o, positions[i], true);
  return out;
}
