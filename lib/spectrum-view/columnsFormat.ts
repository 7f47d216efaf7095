/**
 * Bandkeep's binary form of the data endpoint's curves ("columns" format), for the viewer: the
 * same head as the JSON body, then each curve as raw little-endian numbers, so a 4,096-point
 * spectrum is about 100 KB instead of about 230 KB of JSON, and nothing is parsed on either side.
 *
 *   bytes 0–3   "BKC1"
 *   bytes 4–7   uint32 LE: length H of the head
 *   H bytes     UTF-8 JSON head: { …, points, columns: [{ name, type: "f64" | "f32" }] }
 *   padding     zero bytes up to a multiple of 8
 *   columns     in the head's order, each `points` values: X as float64 (nine significant
 *               digits must survive), curves as float32; NaN marks a missing value
 *
 * Pure and free of Node.js APIs: the browser decodes with the same module.
 */
export const COLUMNS_MEDIA_TYPE = "application/vnd.bandkeep.columns";
const MAGIC = [0x42, 0x4b, 0x43, 0x31]; // "BKC1"

export type ColumnType = "f64" | "f32";
export type Column = { name: string; type: ColumnType; values: ArrayLike<number> };
export type ColumnsHead = Record<string, unknown> & { points: number };

const bytesPer = (type: ColumnType) => (type === "f64" ? 8 : 4);

export function encodeColumns(head: ColumnsHead, columns: Column[]): Uint8Array {
  for (const c of columns) {
    if (c.values.length !== head.points)
      throw new RangeError(`column ${c.name} has ${c.values.length} values, the head says ${head.points}`);
  }
  const headBytes = new TextEncoder().encode(JSON.stringify({ ...head, columns: columns.map(({ name, type }) => ({ name, type })) }));
  const dataStart = Math.ceil((8 + headBytes.length) / 8) * 8;
  const total = dataStart + columns.reduce((s, c) => s + bytesPer(c.type) * head.points, 0);
  const out = new Uint8Array(total);
  out.set(MAGIC, 0);
  new DataView(out.buffer).setUint32(4, headBytes.length, true);
  out.set(headBytes, 8);
  let offset = dataStart;
  for (const c of columns) {
    // Typed-array views write in the platform's byte order; every platform we run on is little-endian.
    const view = c.type === "f64" ? new Float64Array(out.buffer, offset, head.points) : new Float32Array(out.buffer, offset, head.points);
    for (let i = 0; i < head.points; i++) {
      const v = c.values[i]!;
      view[i] = Number.isFinite(v) ? v : Number.NaN;
    }
    offset += bytesPer(c.type) * head.points;
  }
  return out;
}

export type DecodedColumns = {
  head: ColumnsHead & { columns: { name: string; type: ColumnType }[] };
  columns: Record<string, Float64Array | Float32Array>;
};

export function decodeColumns(bytes: ArrayBuffer | Uint8Array): DecodedColumns {
  const u8 = bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  if (u8.length < 8 || MAGIC.some((b, i) => u8[i] !== b)) throw new RangeError("not a Bandkeep columns body (magic bytes missing)");
  const dv = new DataView(u8.buffer, u8.byteOffset, u8.byteLength);
  const headLength = dv.getUint32(4, true);
  if (8 + headLength > u8.length) throw new RangeError("columns body is truncated (head)");
  const head = JSON.parse(new TextDecoder().decode(u8.subarray(8, 8 + headLength))) as DecodedColumns["head"];
  let offset = Math.ceil((8 + headLength) / 8) * 8;
  const columns: DecodedColumns["columns"] = {};
  for (const c of head.columns) {
    const size = bytesPer(c.type) * head.points;
    if (offset + size > u8.length) throw new RangeError(`columns body is truncated (column ${c.name})`);
    // Copy into an aligned buffer: the body may sit at any offset of the caller's buffer.
    const chunk = u8.slice(offset, offset + size).buffer;
    columns[c.name] = c.type === "f64" ? new Float64Array(chunk) : new Float32Array(chunk);
    offset += size;
  }
  return { head, columns };
}
