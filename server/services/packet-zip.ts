// The handoff packet ZIP: every file generated from a frozen contents snapshot, checksummed, then
// streamed through archiver. Given the same snapshot, photos and dates, the files are byte-identical.
import { createHash } from "node:crypto";
import path from "node:path";
import { createRequire } from "node:module";
import type { Archiver, ArchiverOptions, ProgressData } from "archiver";
import type { Readable } from "node:stream";
import type { PacketContents, PacketFabricSnapshot } from "@shared/schemas/packets.js";
import {
  packetManifestJsonSchema,
  PACKET_MANIFEST_SCHEMA_ID,
  type PacketManifest,
  type StitchesFile,
} from "@shared/schemas/packet-manifest.js";
import { meshPanelsForSimulation, meshToObj } from "@shared/domain/panels/mesh.js";
import { panelsToJson, panelsToObj, panelsToSvg, type SeamRef } from "@shared/domain/panels/export.js";
import { panelsToDxf, panelToDxf } from "@shared/domain/panels/dxf-writer.js";
import type { PanelShape } from "@shared/domain/panels/geometry.js";
import { summaryPdf, type PacketBuildMeta } from "./packet-summary.js";

export type { PacketBuildMeta } from "./packet-summary.js";

/** One file of the packet. */
export interface PacketFile {
  path: string;
  data: Buffer;
  mediaType: string;
  description: string;
}

/** Progress while the ZIP is written. */
export interface ZipProgress {
  entriesDone: number;
  entriesTotal: number;
  bytesIn: number;
  bytesTotal: number;
}

// archiver 7 is CommonJS and exports a factory; @types/archiver 8 describes the later class API, so
// load the factory explicitly and type it with the shared Archiver instance type.
const archiver = createRequire(import.meta.url)("archiver") as (format: "zip", options?: ArchiverOptions) => Archiver;

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");
const json = (v: unknown) => Buffer.from(JSON.stringify(v, null, 2) + "\n", "utf8");

/** Panel shapes for the exporters, with names unique across garments (OBJ groups and DXF layers need that). */
export function exportShapes(contents: PacketContents): PanelShape[] {
  const seen = new Map<string, number>();
  return contents.panels.map((p) => {
    let name = `${p.garmentName} - ${p.name}`;
    const n = (seen.get(name) ?? 0) + 1;
    seen.set(name, n);
    if (n > 1) name = `${name} ${n}`;
    return {
      id: p.id,
      name,
      outline: p.outline,
      grainline: p.grainline,
      notches: p.notches,
      seamAllowanceMm: p.seamAllowanceMm,
      cutCount: p.cutCount,
      mirrored: p.mirrored,
      grainMode: p.grainMode,
    };
  });
}

/** ZIP path of a photo in the packet, e.g. photos/03-front-1a2b3c4d.webp. */
export function photoZipPath(index: number, view: string, photoId: string, storageKey: string | null): string {
  const ext = (storageKey ? path.extname(storageKey) : "") || ".jpg";
  return `photos/${String(index + 1).padStart(2, "0")}-${view}-${photoId.slice(0, 8)}${ext.toLowerCase()}`;
}

/** Simulation meshes (one OBJ per panel) and stitches.json; none for versions snapshotted before meshes existed. */
export function simulationFiles(
  contents: PacketContents,
  shapes: PanelShape[],
): { files: PacketFile[]; manifest: NonNullable<PacketManifest["simulation"]> } | null {
  if (contents.meshTargetEdgeMm === undefined || contents.panels.length === 0) return null;
  const sim = meshPanelsForSimulation(
    contents.panels.map((p) => ({ id: p.id, outline: p.outline })),
    contents.seams.map((x) => ({ id: x.id, a: x.a, b: x.b })),
    { targetEdgeMm: contents.meshTargetEdgeMm },
  );
  const shapeOf = new Map(shapes.map((sh) => [sh.id, sh]));
  const pathOf = new Map(
    contents.panels.map((p, i) => [p.id, `meshes/${String(i + 1).padStart(2, "0")}-${slug(shapeOf.get(p.id)!.name)}.obj`]),
  );
  const files: PacketFile[] = sim.meshes.map((m) => ({
    path: pathOf.get(m.panelId)!,
    data: Buffer.from(meshToObj(m, shapeOf.get(m.panelId)!.name), "utf8"),
    mediaType: "model/obj",
    description: `Simulation mesh of ${shapeOf.get(m.panelId)!.name}: ${m.triangles.length / 3} triangles, min angle ${m.minAngleDeg.toFixed(1)}° (v in metres, vt in millimetres)`,
  }));
  const seamName = new Map(contents.seams.map((x) => [x.id, x.name]));
  const stitches: StitchesFile = {
    format: "seamscene-stitches",
    formatVersion: 1,
    indexBase: 0,
    targetEdgeMm: sim.targetEdgeMm,
    minAngleTargetDeg: sim.minAngleTargetDeg,
    seams: sim.stitches.map((st) => ({
      seamId: st.seamId,
      name: seamName.get(st.seamId) ?? st.seamId,
      a: { mesh: pathOf.get(st.a.panelId)!, panelId: st.a.panelId },
      b: { mesh: pathOf.get(st.b.panelId)!, panelId: st.b.panelId },
      pairs: st.a.indices.map((ia, k) => [ia, st.b.indices[k]] as [number, number]),
    })),
    skipped: sim.skipped.map((x) => ({ ...x, name: seamName.get(x.seamId) ?? x.seamId })),
  };
  files.push({
    path: "stitches.json",
    data: json(stitches),
    mediaType: "application/json",
    description: "Mesh vertex pairs a simulator joins along each seam (0-based indices into meshes/*.obj)",
  });
  const panelOf = new Map(contents.panels.map((p) => [p.id, p]));
  return {
    files,
    manifest: {
      targetEdgeMm: sim.targetEdgeMm,
      minAngleTargetDeg: sim.minAngleTargetDeg,
      units: { positions: "m", uv: "mm" },
      meshes: sim.meshes.map((m) => ({
        path: pathOf.get(m.panelId)!,
        panelId: m.panelId,
        name: shapeOf.get(m.panelId)!.name,
        vertexCount: m.vertices.length,
        triangleCount: m.triangles.length / 3,
        boundaryVertexCount: m.boundaryCount,
        minAngleDeg: Math.round(m.minAngleDeg * 100) / 100,
        areaM2: m.areaMm2 / 1e6,
        cutCount: panelOf.get(m.panelId)!.cutCount,
        mirrored: panelOf.get(m.panelId)!.mirrored,
      })),
      stitches: {
        path: "stitches.json",
        seamCount: stitches.seams.length,
        pairCount: stitches.seams.reduce((n, x) => n + x.pairs.length, 0),
      },
    },
  };
}

/** The virtual cantilever re-test beside a fabric in fabrics.json (absent for versions snapshotted before it existed). */
function retestField(f: PacketFabricSnapshot): { cantileverRetest?: PacketFabricSnapshot["retest"] } {
  return f.retest === undefined ? {} : { cantileverRetest: f.retest };
}

/** A deep copy with object keys sorted, so a snapshot read back from jsonb (which reorders keys) writes the same bytes. */
export function canonical<T>(v: T): T {
  if (Array.isArray(v)) return v.map(canonical) as T;
  if (v && typeof v === "object" && !(v instanceof Date)) {
    return Object.fromEntries(
      Object.keys(v)
        .sort()
        .map((k) => [k, canonical((v as Record<string, unknown>)[k])]),
    ) as T;
  }
  return v;
}

/** What each packet file builder gets. */
export interface PacketBuildContext {
  /** The snapshot with keys sorted (see {@link canonical}). */
  contents: PacketContents;
  meta: PacketBuildMeta;
  /** Panels for the exporters, names unique across garments. */
  shapes: PanelShape[];
  seamRefs: SeamRef[];
  /** The flat OBJ export, shared by panels.obj and seams.json. */
  obj: ReturnType<typeof panelsToObj>;
  readPhoto: (storageKey: string) => Promise<Buffer>;
  /** Simulation meshes and stitches (null for versions snapshotted before meshes existed), shared by their files and the manifest. */
  simulation: ReturnType<typeof simulationFiles>;
}

/** Builds some files of the packet (none when it has nothing to add). */
export type PacketFileBuilder = (ctx: PacketBuildContext) => PacketFile[] | Promise<PacketFile[]>;

/** File-name-safe form of a piece name: "Jacket - Front" → "jacket-front". */
function slug(s: string): string {
  return (
    s
      .normalize("NFKD")
      .replace(/\p{M}+/gu, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60) || "piece"
  );
}

const panelsJson: PacketFileBuilder = ({ contents, shapes }) => {
  const extra = new Map(contents.panels.map((p) => [p.id, p]));
  return [
    {
      path: "panels.json",
      // The shared writer, plus the garment, fabric and area of each piece.
      data: Buffer.from(
        panelsToJson(
          shapes.map((s) => ({
            ...s,
            garmentId: extra.get(s.id)!.garmentId,
            fabricId: extra.get(s.id)!.fabricId,
            areaMm2: extra.get(s.id)!.areaMm2,
          })),
        ) + "\n",
        "utf8",
      ),
      mediaType: "application/json",
      description: "Flat pattern pieces: sew-line outline, grainline, notches, seam allowance, cut count (millimetres, y up)",
    },
  ];
};

const panelsSvg: PacketFileBuilder = ({ shapes }) => [
  {
    path: "panels.svg",
    data: Buffer.from(panelsToSvg(shapes), "utf8"),
    mediaType: "image/svg+xml",
    description: "Pieces drawn 1:1 in millimetres: sew line, cut line, grainline, notches",
  },
];

const dxfDescription = "ASTM D6673 layers: cut line 1, sew line 14, grain line 7, notches 4; piece name and quantity as text (millimetres)";
const panelsDxf: PacketFileBuilder = ({ shapes }) => [
  {
    path: "panels.dxf",
    data: Buffer.from(panelsToDxf(shapes), "utf8"),
    mediaType: "image/vnd.dxf",
    description: `Every piece in one ASCII DXF, one block each; ${dxfDescription}`,
  },
  ...shapes.map((s, i) => ({
    path: `dxf/${String(i + 1).padStart(2, "0")}-${slug(s.name)}.dxf`,
    data: Buffer.from(panelToDxf(s), "utf8"),
    mediaType: "image/vnd.dxf",
    description: `${s.name}: ${dxfDescription}`,
  })),
];

const panelsObj: PacketFileBuilder = ({ obj, contents }) => [
  {
    path: "panels.obj",
    data: Buffer.from(obj.obj, "utf8"),
    mediaType: "model/obj",
    description: "Each piece flat and triangulated (metres, z = 0), one group per piece, UV = flat position",
  },
  {
    path: "seams.json",
    data: json({
      ...obj.seams,
      seams: obj.seams.seams.map((s) => ({ ...s, name: contents.seams.find((x) => x.id === s.id)?.name ?? s.id })),
    }),
    mediaType: "application/json",
    description: "Which panels.obj vertex runs are sewn together (1-based OBJ indices)",
  },
];

const simulationMeshes: PacketFileBuilder = ({ simulation }) => simulation?.files ?? [];

const fabricsJson: PacketFileBuilder = ({ contents }) => [
  {
    path: "fabrics.json",
    data: json({
      units: "SI",
      fabrics: contents.fabrics.map((f) => ({
        id: f.id,
        name: f.name,
        construction: f.construction,
        fabricClass: f.fabricClass,
        fibreContent: f.fibreContent,
        widthM: f.widthMm === null ? null : f.widthMm / 1000,
        simulation: f.simulation,
        tests: f.tests,
        ...retestField(f),
      })),
      panels: contents.panels.map((p) => ({ panelId: p.id, fabricId: p.fabricId })),
    }),
    mediaType: "application/json",
    description:
      "Simulation values per fabric, each measured (with its tests) or assumed (class default), and the cantilever re-test of the bending values (overhangs in mm)",
  },
];

const measurementsJson: PacketFileBuilder = ({ contents }) =>
  contents.measurements
    ? [
        {
          path: "measurements.json",
          data: json({
            units: "m",
            personalData: true,
            performer: contents.measurements.performerName,
            takenOn: contents.measurements.takenOn,
            valuesM: Object.fromEntries(Object.entries(contents.measurements.valuesMm).map(([k, v]) => [k, v / 1000])),
          }),
          mediaType: "application/json",
          description: "Performer body measurements (ISO 8559-1 names, metres); personal data",
        },
      ]
    : [];

const photos: PacketFileBuilder = async ({ contents, readPhoto }) => {
  const out: PacketFile[] = [];
  for (const p of contents.photos) {
    if (!p.storageKey) continue;
    out.push({
      path: p.fileName,
      data: await readPhoto(p.storageKey),
      mediaType: mediaTypeOf(p.fileName),
      description: `${p.ownerType} photo, ${p.view}${p.caption ? `: ${p.caption}` : ""}`,
    });
  }
  return out;
};

const shotsJson: PacketFileBuilder = ({ contents }) => [
  {
    path: "shots.json",
    data: json({ shots: contents.shots }),
    mediaType: "application/json",
    description: "Effects shots with the distress stage worn and continuity photos",
  },
];

const summary: PacketFileBuilder = async ({ contents, meta }) => [
  {
    path: "summary.pdf",
    data: await summaryPdf(contents, meta, contents.production.title),
    mediaType: "application/pdf",
    description: "Summary: panels, fabrics, shots",
  },
];

const manifestSchema: PacketFileBuilder = () => [
  {
    path: "manifest.schema.json",
    data: json(packetManifestJsonSchema()),
    mediaType: "application/schema+json",
    description: "JSON Schema of manifest.json",
  },
];

/**
 * The files of a packet, in ZIP order: the one place a file is added. manifest.json (listing them all)
 * goes first and SHA256SUMS (covering all the others) last.
 */
export const PACKET_FILE_BUILDERS: readonly PacketFileBuilder[] = [
  panelsJson,
  panelsSvg,
  panelsDxf,
  panelsObj,
  simulationMeshes,
  fabricsJson,
  measurementsJson,
  photos,
  shotsJson,
  summary,
  manifestSchema,
];

/**
 * Every file of the packet, SHA256SUMS last (covering all the others).
 * @param readPhoto reads a photo file by storage key
 * @param onProgress called after each group of files with (groups done, groups in all)
 */
export async function buildPacketFiles(
  snapshot: PacketContents,
  meta: PacketBuildMeta,
  readPhoto: (storageKey: string) => Promise<Buffer>,
  onProgress?: (done: number, total: number) => void,
): Promise<PacketFile[]> {
  const contents = canonical(snapshot);
  const shapes = exportShapes(contents);
  const seamRefs: SeamRef[] = contents.seams.map((s) => ({ id: s.id, a: s.a, b: s.b }));
  const ctx: PacketBuildContext = {
    contents,
    meta,
    shapes,
    seamRefs,
    obj: panelsToObj(shapes, seamRefs),
    readPhoto,
    simulation: simulationFiles(contents, shapes),
  };
  const files: PacketFile[] = [];
  for (const [i, build] of PACKET_FILE_BUILDERS.entries()) {
    files.push(...(await build(ctx)));
    onProgress?.(i + 1, PACKET_FILE_BUILDERS.length);
  }

  const manifest: PacketManifest = {
    $schema: PACKET_MANIFEST_SCHEMA_ID,
    format: "seamscene-handoff-packet",
    formatVersion: 1,
    units: {
      length: "m",
      mass: "kg",
      massPerArea: "kg/m²",
      bendingStiffness: "N·m",
      stretchStiffness: "N/m",
      shearStiffness: "N/m/rad",
      patternFiles: "mm",
    },
    production: contents.production,
    character: contents.character,
    change: contents.change,
    version: meta.version,
    packetId: meta.packetId,
    dates: { publishedAt: meta.publishedAt.toISOString(), builtAt: meta.publishedAt.toISOString() },
    publishedBy: meta.publishedByName,
    contents: {
      garments: contents.garments.map((g) => ({ id: g.id, name: g.name, category: g.category, tagCode: g.tagCode })),
      panelCount: contents.panels.length,
      seamCount: contents.seams.length,
      fabricCount: contents.fabrics.length,
      photoCount: contents.photos.length,
      shotCount: contents.shots.length,
      measurementsIncluded: Boolean(contents.measurements),
      files: files.map((f) => ({
        path: f.path,
        mediaType: f.mediaType,
        bytes: f.data.length,
        sha256: sha256(f.data),
        description: f.description,
      })),
    },
    notes: contents.notes,
    ...(ctx.simulation ? { simulation: ctx.simulation.manifest } : {}),
  };
  files.unshift({ path: "manifest.json", data: json(manifest), mediaType: "application/json", description: "What this packet holds" });
  // sha256sum's text format: "<hex>  <path>", one line per file.
  const sums = files.map((f) => `${sha256(f.data)}  ${f.path}`).join("\n") + "\n";
  files.push({ path: "SHA256SUMS", data: Buffer.from(sums, "utf8"), mediaType: "text/plain", description: "SHA-256 of every other file" });
  return files;
}

function mediaTypeOf(name: string): string {
  const ext = path.extname(name).toLowerCase();
  return (
    { ".webp": "image/webp", ".jpg": "image/jpeg", ".jpeg": "image/jpeg", ".png": "image/png", ".heic": "image/heic" }[ext] ??
    "application/octet-stream"
  );
}

/**
 * Streams the files as a ZIP (archiver). Entries carry the given date so a rebuild is byte-identical.
 * @returns the archive stream; read or pipe it to get the bytes
 */
export function zipPacketFiles(files: PacketFile[], options: { date: Date; onProgress?: (p: ZipProgress) => void }): Readable {
  const archive = archiver("zip", { zlib: { level: 6 } });
  const bytesTotal = files.reduce((s, f) => s + f.data.length, 0);
  archive.on("progress", (p: ProgressData) =>
    options.onProgress?.({ entriesDone: p.entries.processed, entriesTotal: files.length, bytesIn: p.fs.processedBytes, bytesTotal }),
  );
  for (const f of files) {
    // Photos are already compressed; storing them saves time without growing the file.
    const store = f.path.startsWith("photos/");
    archive.append(f.data, { name: f.path, date: options.date, store });
  }
  void archive.finalize();
  return archive;
}
