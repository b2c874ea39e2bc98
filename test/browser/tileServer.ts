/**
 * A loopback tile server for the browser tests: answers every GET with a small generated PNG
 * (PNG specification, ISO/IEC 15948: signature, IHDR, IDAT holding zlib-deflated scanlines,
 * IEND, each chunk with its CRC-32) and records the paths asked for. Listens on 127.0.0.1 only.
 */
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { deflateSync } from "node:zlib";

/** CRC-32 as the PNG specification defines it (polynomial 0xEDB88320, reflected). */
function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "ascii");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/**
 * A `size x size` RGB PNG: a light fill with a darker grid line on the top and left edges, so
 * tile seams are visible in a screenshot.
 */
export function tilePng(size = 256, fill: [number, number, number] = [225, 236, 222]): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type: truecolour
  const rows: Buffer[] = [];
  for (let y = 0; y < size; y++) {
    const row = Buffer.alloc(1 + size * 3); // filter byte 0 (none), then RGB triples
    for (let x = 0; x < size; x++) {
      const edge = x === 0 || y === 0;
      row.set(edge ? [160, 175, 160] : fill, 1 + x * 3);
    }
    rows.push(row);
  }
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk("IHDR", ihdr), chunk("IDAT", deflateSync(Buffer.concat(rows))), chunk("IEND", Buffer.alloc(0))]);
}

/** Start the server on a free loopback port. */
export async function startTileServer(): Promise<{ url: string; requests: string[]; close: () => Promise<void> }> {
  const png = tilePng();
  const requests: string[] = [];
  const server: Server = createServer((req, res) => {
    requests.push(req.url ?? "");
    res.writeHead(200, { "Content-Type": "image/png", "Content-Length": png.length, "Cache-Control": "no-store" });
    res.end(png);
  });
  await new Promise<void>((ok) => server.listen(0, "127.0.0.1", ok));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    requests,
    close: () => new Promise<void>((ok) => server.close(() => ok())),
  };
}
