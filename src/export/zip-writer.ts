/**
 * A small ZIP archive writer (PKWARE APPNOTE 6.3: local headers, central directory, end record;
 * no ZIP64, so entries and the archive stay below 4 GiB). Entries are deflated by Node's zlib
 * (raw deflate, the ZIP method 8), or stored when deflate does not make them smaller. Every entry
 * carries the same fixed DOS timestamp, so the same entries give the same bytes. The entries are
 * deflated at once on Node's thread pool (the same zlib, so the same bytes as one by one).
 */
import { deflateRaw } from 'node:zlib';
import { promisify } from 'node:util';

const deflateRawAsync = promisify(deflateRaw);

/** One file of the archive: its name (UTF-8, '/' separators) and bytes or text. */
export interface ZipEntry {
  readonly name: string;
  readonly data: Uint8Array | string;
}

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 (IEEE 802.3 polynomial, reflected, as ZIP and gzip use) of the bytes. */
export function crc32(data: Uint8Array): number {
  let c = 0xffffffff;
  for (let i = 0; i < data.length; i++) c = CRC_TABLE[(c ^ data[i]!) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** DOS date and time words of a UTC date (2-second resolution, years 1980-2107). */
function dosDateTime(d: Date): { date: number; time: number } {
  const year = Math.min(2107, Math.max(1980, d.getUTCFullYear()));
  return {
    date: ((year - 1980) << 9) | ((d.getUTCMonth() + 1) << 5) | d.getUTCDate(),
    time: (d.getUTCHours() << 11) | (d.getUTCMinutes() << 5) | Math.floor(d.getUTCSeconds() / 2),
  };
}

/** The fields a local header and a central directory record share, in the same order. */
interface EntryFields {
  readonly method: number;
  readonly time: number;
  readonly date: number;
  readonly crc: number;
  /** Bytes stored (compressed). */
  readonly stored: number;
  /** Bytes of the file. */
  readonly size: number;
  readonly nameLength: number;
}

/** Writes flags (UTF-8 names), method, time, date, CRC, sizes and name length from byte `at` on. */
function writeEntryFields(buf: Buffer, at: number, f: EntryFields): void {
  buf.writeUInt16LE(0x0800, at);
  buf.writeUInt16LE(f.method, at + 2);
  buf.writeUInt16LE(f.time, at + 4);
  buf.writeUInt16LE(f.date, at + 6);
  buf.writeUInt32LE(f.crc, at + 8);
  buf.writeUInt32LE(f.stored, at + 12);
  buf.writeUInt32LE(f.size, at + 16);
  buf.writeUInt16LE(f.nameLength, at + 20);
}

/** The archive bytes of the entries, in order; deflate level 0-9, all entries dated `date` (UTC). */
export async function zipArchive(entries: readonly ZipEntry[], date: Date, level = 6): Promise<Uint8Array> {
  const { date: dd, time: dt } = dosDateTime(date);
  const parts: Uint8Array[] = [];
  const central: Uint8Array[] = [];
  let offset = 0;
  const raws = entries.map((e) => (typeof e.data === 'string' ? Buffer.from(e.data, 'utf8') : e.data));
  const deflatedAll = await Promise.all(raws.map((raw) => deflateRawAsync(raw, { level })));
  for (const [q, e] of entries.entries()) {
    const name = Buffer.from(e.name, 'utf8');
    const raw = raws[q]!;
    const deflated = deflatedAll[q]!;
    const method = deflated.length < raw.length ? 8 : 0;
    const body = method === 8 ? deflated : raw;
    const crc = crc32(raw);
    if (raw.length >= 0xffffffff || offset >= 0xffffffff) throw new RangeError(`zip entry ${e.name}: archives over 4 GiB need ZIP64, which this writer does not write`);
    const fields: EntryFields = { method, time: dt, date: dd, crc, stored: body.length, size: raw.length, nameLength: name.length };
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4); // version needed: 2.0 (deflate)
    writeEntryFields(local, 6, fields); // extra length at 28: 0
    const cd = Buffer.alloc(46);
    cd.writeUInt32LE(0x02014b50, 0);
    cd.writeUInt16LE(20, 4); // made by: MS-DOS host, version 2.0
    cd.writeUInt16LE(20, 6);
    writeEntryFields(cd, 8, fields);
    // extra length, comment length, disk number, internal and external attributes: 0
    cd.writeUInt32LE(offset, 42);
    parts.push(local, name, body);
    central.push(cd, name);
    offset += local.length + name.length + body.length;
  }
  const cdSize = central.reduce((a, b) => a + b.length, 0);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(cdSize, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...parts, ...central, end]);
}
