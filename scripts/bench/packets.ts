// Benchmark: build a handoff packet ZIP of 40 panels and 12 photos (no database; photos are random
// bytes of typical JPEG size, which do not compress, like real photos) and print time and size.
import { randomBytes, randomUUID } from "node:crypto";
import { pathToFileURL } from "node:url";
import { buildPacketFiles, zipPacketFiles, type ZipProgress } from "../../server/services/packet-zip";
import type { PacketContents } from "../../shared/schemas/packets";
import { fabricSimulationValues } from "../../shared/domain/fabric-physics";
import { polygonArea } from "../../shared/domain/panels/geometry";
import { benchPieces } from "./nesting";

const PANELS = 40;
const PHOTOS = 12;
const PHOTO_BYTES = 350_000;

/** Synthetic contents: the nesting bench's pieces repeated to 40 panels over 4 garments. */
function benchContents(): { contents: PacketContents; photos: Map<string, Buffer> } {
  const pieces = benchPieces();
  const garments = Array.from({ length: 4 }, (_, i) => ({
    id: randomUUID(),
    name: `Garment ${i + 1}`,
    category: "jacket",
    tagCode: `B-${i + 1}`,
    fabricId: "fabric-1",
  }));
  const panels = Array.from({ length: PANELS }, (_, i) => {
    const p = pieces[i % pieces.length]!;
    const g = garments[i % garments.length]!;
    return {
      id: randomUUID(),
      garmentId: g.id,
      garmentName: g.name,
      name: `${p.name ?? p.id} ${Math.floor(i / pieces.length) + 1}`,
      outline: p.outline.map(([x, y]) => [x, y] as [number, number]),
      grainline: null,
      notches: [],
      seamAllowanceMm: 10,
      cutCount: p.cutCount,
      mirrored: Boolean(p.mirrored),
      grainMode: p.grainMode ?? "straight",
      fabricId: "fabric-1",
      areaMm2: polygonArea(p.outline),
    };
  });
  const photos = new Map<string, Buffer>();
  const photoRows = Array.from({ length: PHOTOS }, (_, i) => {
    const id = randomUUID();
    const key = `photos/${id}/display.jpg`;
    photos.set(key, randomBytes(PHOTO_BYTES));
    return {
      id,
      fileName: `photos/${String(i + 1).padStart(2, "0")}-front-${id.slice(0, 8)}.jpg`,
      view: "front",
      caption: null,
      ownerType: "continuity_entry",
      ownerId: id,
      contentHash: "0".repeat(64),
      storageKey: key,
    };
  });
  const contents: PacketContents = {
    schemaVersion: 1,
    production: { id: randomUUID(), title: "Benchmark production", kind: "film" },
    character: { id: randomUUID(), name: "Bench Character" },
    change: { id: randomUUID(), number: 1, description: null },
    garments,
    panels,
    seams: [],
    fabrics: [
      {
        id: "fabric-1",
        name: "Wool",
        construction: "woven",
        fabricClass: "woven_medium",
        fibreContent: [],
        widthMm: 1500,
        simulation: fabricSimulationValues({ fabricClass: "woven_medium", tests: [] }),
        tests: [],
      },
    ],
    photos: photoRows,
    shots: [],
    measurements: null,
    notes: null,
  };
  return { contents, photos };
}

/** Builds the packet and prints time and size; returns the figures. */
export async function runPacketBench(): Promise<{ buildMs: number; zipMs: number; bytes: number }> {
  const { contents, photos } = benchContents();
  const publishedAt = new Date("2026-12-01T12:00:00Z");
  const t0 = performance.now();
  const files = await buildPacketFiles(contents, { packetId: randomUUID(), version: 1, publishedAt, publishedByName: "Bench" }, async (k) =>
    photos.get(k)!,
  );
  const t1 = performance.now();
  let bytes = 0;
  let last: ZipProgress | null = null;
  for await (const chunk of zipPacketFiles(files, { date: publishedAt, onProgress: (p) => (last = p) })) bytes += (chunk as Buffer).length;
  const t2 = performance.now();
  const input = files.reduce((s, f) => s + f.data.length, 0);
  console.log(`packet: ${PANELS} panels, ${PHOTOS} photos of ${(PHOTO_BYTES / 1000).toFixed(0)} kB, ${files.length} files`);
  console.log(`  files built     ${(t1 - t0).toFixed(0)} ms`);
  console.log(`  ZIP streamed    ${(t2 - t1).toFixed(0)} ms`);
  console.log(`  total           ${(t2 - t0).toFixed(0)} ms`);
  console.log(`  size            ${(bytes / 1e6).toFixed(2)} MB (files ${(input / 1e6).toFixed(2)} MB)`);
  console.log(
    `  progress events last at ${last ? `${(last as ZipProgress).entriesDone}/${(last as ZipProgress).entriesTotal} entries` : "none"}`,
  );
  return { buildMs: t1 - t0, zipMs: t2 - t1, bytes };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runPacketBench();
}
