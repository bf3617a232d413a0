// manifest.json of a handoff packet ZIP: our own documented schema. The JSON Schema written beside
// it in the ZIP (manifest.schema.json) is generated from this zod schema, so the two cannot drift.
import { z } from "zod";

/** Schema identifier written into every manifest. */
export const PACKET_MANIFEST_SCHEMA_ID = "https://seamscene.invalid/schemas/handoff-packet-manifest/v1.json";

const fileEntry = z.object({
  /** Path inside the ZIP, forward slashes. */
  path: z.string().min(1),
  /** IANA media type. */
  mediaType: z.string().min(1),
  /** Size in bytes. */
  bytes: z.number().int().min(0),
  /** SHA-256 of the file, lowercase hex (also listed in SHA256SUMS). */
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  /** What the file holds. */
  description: z.string(),
});

/** One simulation mesh of the packet (meshes/*.obj). */
const simulationMeshEntry = z.object({
  /** Path of the OBJ file inside the ZIP. */
  path: z.string().min(1),
  panelId: z.string(),
  /** "Garment - panel". */
  name: z.string(),
  vertexCount: z.number().int().min(3),
  triangleCount: z.number().int().min(1),
  /** The first this many vertices run along the sew line, in outline order. */
  boundaryVertexCount: z.number().int().min(3),
  /** Smallest triangle angle in this mesh, degrees. */
  minAngleDeg: z.number(),
  /** Sum of the triangle areas, m² (equals the sew-line area). */
  areaM2: z.number(),
  /** Copies cut from the fabric; instance the mesh once per copy. */
  cutCount: z.number().int().min(1),
  /** Copies are cut as mirrored pairs: every second copy is the mesh mirrored (x → −x, same vertex indices, winding reversed). */
  mirrored: z.boolean(),
});

/**
 * stitches.json: which mesh vertices a simulator joins along each seam. Both sides of a seam have the
 * same number of vertices, paired in order at matching fractions of each side's length (an eased
 * side's extra length spread evenly).
 */
export const stitchesFileSchema = z
  .object({
    format: z.literal("seamscene-stitches"),
    formatVersion: z.literal(1),
    /** Vertex indices count from 0 in the order of the OBJ file's `v` lines. */
    indexBase: z.literal(0),
    /** Target edge length the meshes were made for, mm. */
    targetEdgeMm: z.number(),
    /** Smallest triangle angle aimed for, degrees (outline corners sharper than that limit it). */
    minAngleTargetDeg: z.number(),
    seams: z.array(
      z.object({
        seamId: z.string(),
        name: z.string(),
        /** Side A: its mesh file and panel. */
        a: z.object({ mesh: z.string(), panelId: z.string() }),
        b: z.object({ mesh: z.string(), panelId: z.string() }),
        /** Vertex pairs [index in A's mesh, index in B's mesh], from the seam's start to its end. */
        pairs: z.array(z.tuple([z.number().int().min(0), z.number().int().min(0)])),
      }),
    ),
    /** Seams that got no stitches, with the reason. */
    skipped: z.array(z.object({ seamId: z.string(), name: z.string(), reason: z.string() })),
  })
  .meta({
    title: "Seamscene seam stitches",
    description: "Vertex pairs of the simulation meshes that a cloth solver joins along each seam.",
  });

export type StitchesFile = z.infer<typeof stitchesFileSchema>;

/** The simulation part of a packet: one mesh per panel plus stitches.json. */
const simulationEntry = z.object({
  /** Target edge length chosen when publishing, mm. */
  targetEdgeMm: z.number(),
  /** Smallest triangle angle aimed for, degrees. */
  minAngleTargetDeg: z.number(),
  /** OBJ vertex positions are in metres (flat, z = 0); texture coordinates are the flat pattern position in millimetres. */
  units: z.object({ positions: z.literal("m"), uv: z.literal("mm") }),
  meshes: z.array(simulationMeshEntry),
  /** Path of stitches.json (its schema is $defs.stitchesFile of manifest.schema.json). */
  stitches: z.object({ path: z.string(), seamCount: z.number().int().min(0), pairCount: z.number().int().min(0) }),
});

/** The manifest of one packet version. */
export const packetManifestSchema = z
  .object({
    $schema: z.literal(PACKET_MANIFEST_SCHEMA_ID),
    format: z.literal("seamscene-handoff-packet"),
    formatVersion: z.literal(1),
    /** Units of every value in the packet, except where a file says otherwise (panels.json, panels.svg, panels.dxf and dxf/ use millimetres). */
    units: z.object({
      length: z.literal("m"),
      mass: z.literal("kg"),
      massPerArea: z.literal("kg/m²"),
      bendingStiffness: z.literal("N·m"),
      stretchStiffness: z.literal("N/m"),
      shearStiffness: z.literal("N/m/rad"),
      patternFiles: z.literal("mm"),
    }),
    production: z.object({ id: z.string(), title: z.string(), kind: z.string() }),
    character: z.object({ id: z.string(), name: z.string() }),
    change: z.object({ id: z.string(), number: z.number().int(), description: z.string().nullable() }),
    version: z.number().int().min(1),
    packetId: z.string(),
    dates: z.object({
      /** When this version was published (ISO 8601). */
      publishedAt: z.string(),
      /** When the ZIP was written (ISO 8601). */
      builtAt: z.string(),
    }),
    publishedBy: z.string(),
    contents: z.object({
      garments: z.array(z.object({ id: z.string(), name: z.string(), category: z.string(), tagCode: z.string() })),
      panelCount: z.number().int().min(0),
      seamCount: z.number().int().min(0),
      fabricCount: z.number().int().min(0),
      photoCount: z.number().int().min(0),
      shotCount: z.number().int().min(0),
      /** Whether measurements.json (personal data) is included. */
      measurementsIncluded: z.boolean(),
      files: z.array(fileEntry),
    }),
    notes: z.string().nullable(),
    /** Simulation meshes and stitches (absent in versions published before they existed). */
    simulation: simulationEntry.optional(),
  })
  .meta({ title: "Seamscene handoff packet manifest", description: "Describes one immutable version of a digital-double handoff packet." });

export type PacketManifest = z.infer<typeof packetManifestSchema>;

/** The JSON Schema (draft 2020-12) of manifest.json. */
export function packetManifestJsonSchema(): Record<string, unknown> {
  const manifest = z.toJSONSchema(packetManifestSchema, { target: "draft-2020-12" }) as Record<string, unknown>;
  const { $schema: _s, ...stitches } = z.toJSONSchema(stitchesFileSchema, { target: "draft-2020-12" }) as Record<string, unknown>;
  const defs = (manifest.$defs as Record<string, unknown> | undefined) ?? {};
  return { ...manifest, $id: PACKET_MANIFEST_SCHEMA_ID, $defs: { ...defs, stitchesFile: stitches } };
}
