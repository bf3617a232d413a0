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
  })
  .meta({ title: "Seamscene handoff packet manifest", description: "Describes one immutable version of a digital-double handoff packet." });

export type PacketManifest = z.infer<typeof packetManifestSchema>;

/** The JSON Schema (draft 2020-12) of manifest.json. */
export function packetManifestJsonSchema(): Record<string, unknown> {
  return { ...z.toJSONSchema(packetManifestSchema, { target: "draft-2020-12" }), $id: PACKET_MANIFEST_SCHEMA_ID };
}
