// Fabric test results → SI values a cloth simulator can take (for digital doubles).
// Formulas and examples: ASTM D1388-18, ASTM D3776/D3776M-20, the strip test (Hooke's law per width) and KES-F (Kawabata 1980); see docs/references.md.

/** Standard gravity g_n in m/s² (exact by convention; also defines the gram-force). */
export const STANDARD_GRAVITY = 9.80665;
/** One gram-force in newtons. */
export const GRAM_FORCE_N = STANDARD_GRAVITY / 1000;
/** ASTM D1388 option A cantilever incline, degrees below horizontal. */
export const D1388_CANTILEVER_ANGLE_DEG = 41.5;

/** Warp (lengthwise, wales in knits) or weft (crosswise, courses in knits). */
export type FabricDirection = "warp" | "weft";

/** Mass per area of a specimen. */
export interface MassPerArea {
  gPerM2: number;
  kgPerM2: number;
}

/**
 * ASTM D3776 mass per unit area from a specimen's mass and dimensions (m/A).
 * @param massG specimen mass in grams
 * @param lengthMm specimen length in mm
 * @param widthMm specimen width in mm
 */
export function massPerArea(massG: number, lengthMm: number, widthMm: number): MassPerArea {
  positive({ massG, lengthMm, widthMm });
  // g / mm² × 1e6 = g/m²; multiply first so 1.35 g on 100 × 100 mm gives 135 exactly.
  const gPerM2 = (massG * 1e6) / (lengthMm * widthMm);
  return { gPerM2, kgPerM2: gPerM2 / 1000 };
}

/** Mass per linear metre (g/m) of cloth of the given width, from its mass per area (ASTM D3776 §3.1.1). */
export function linearDensityGPerM(gPerM2: number, widthMm: number): number {
  return (gPerM2 * widthMm) / 1000;
}

/** ASTM D1388 option A: bending length c = overhang / 2 at the 41.5° incline (mm in, mm out). */
export function bendingLengthFromOverhang(overhangMm: number): number {
  positive({ overhangMm });
  return overhangMm / 2;
}

/**
 * Peirce's closed form c = l·(cos(θ/2) / (8·tan θ))^(1/3), for cantilever readings at other angles.
 * Documented alternative only: at 41.5° it gives 0.5093·l, ~1.9 % above D1388's l/2, which matches the
 * exact heavy-elastica solution (Peirce 1930); it is close to exact only at small angles.
 */
export function peirceBendingLength(overhangMm: number, angleDeg: number): number {
  positive({ overhangMm });
  if (!(angleDeg > 0 && angleDeg < 90)) throw new RangeError("angle must be between 0 and 90 degrees");
  const t = (angleDeg * Math.PI) / 180;
  return overhangMm * Math.cbrt(Math.cos(t / 2) / (8 * Math.tan(t)));
}

/**
 * Flexural rigidity per unit width G = W·g_n·c³ (ASTM D1388), in N·m.
 * @param massPerAreaGsm fabric mass per area W in g/m²
 * @param bendingLengthMm bending length c in mm
 */
export function flexuralRigidity(massPerAreaGsm: number, bendingLengthMm: number): number {
  positive({ massPerAreaGsm, bendingLengthMm });
  const c = bendingLengthMm / 1000;
  return (massPerAreaGsm / 1000) * STANDARD_GRAVITY * c * c * c;
}

/** Converts N·m to µN·m (the usual unit for fabric bending rigidity). */
export function toMicroNewtonMetres(newtonMetres: number): number {
  return newtonMetres * 1e6;
}

/** Bending stiffness EI (N·m²) of a strip of the given width from rigidity per unit width G (N·m). */
export function stripBendingStiffness(rigidityNm: number, stripWidthMm: number): number {
  return rigidityNm * (stripWidthMm / 1000);
}

/** Equivalent bending modulus E_b = 12·G / t³ (Pa) for a fabric of thickness t (mm). */
export function equivalentBendingModulus(rigidityNm: number, thicknessMm: number): number {
  positive({ thicknessMm });
  const t = thicknessMm / 1000;
  return (12 * rigidityNm) / (t * t * t);
}

/** A strip tensile reading (ISO 13934-1 / ASTM D5035 style). */
export interface StripReading {
  /** Load at the reading, N. */
  loadN: number;
  /** Strip width, mm (50 mm in ISO 13934-1). */
  stripWidthMm: number;
  /** Gauge (clamp) length, mm (200 mm in ISO 13934-1). */
  gaugeLengthMm: number;
  /** Extension at that load, mm. */
  extensionMm: number;
}

/** Tensile stiffness per unit width k = (F/b)/ε in N/m, ε = extension / gauge length. */
export function tensileStiffnessPerWidth(r: StripReading): number {
  // Name the fields: a recorded test passed here also carries id, kind and direction.
  positive({ loadN: r.loadN, stripWidthMm: r.stripWidthMm, gaugeLengthMm: r.gaugeLengthMm, extensionMm: r.extensionMm });
  const forcePerWidth = r.loadN / (r.stripWidthMm / 1000);
  const strain = r.extensionMm / r.gaugeLengthMm;
  return forcePerWidth / strain;
}

/** Young's modulus E = k / t (Pa) from stiffness per width (N/m) and thickness (mm). */
export function youngsModulus(stiffnessPerWidthNPerM: number, thicknessMm: number): number {
  positive({ thicknessMm });
  return stiffnessPerWidthNPerM / (thicknessMm / 1000);
}

/** Static friction coefficient from the incline angle at which a fabric sample starts to slide: μ = tan θ. */
export function frictionFromSlideAngle(angleDeg: number): number {
  if (!(angleDeg >= 0 && angleDeg < 90)) throw new RangeError("angle must be in [0, 90) degrees");
  return Math.tan((angleDeg * Math.PI) / 180);
}

/**
 * Kawabata KES-F units → SI (Kawabata 1980, KES-F, from memory; factors computed from gf = 9.80665e-3 N).
 * Units of B and 2HB are from memory; EMT's 500 gf/cm reference load is from memory.
 */
export const KES_TO_SI = {
  B: { kesUnit: "gf·cm²/cm", siUnit: "N·m", factor: GRAM_FORCE_N * 1e-2 },
  "2HB": { kesUnit: "gf·cm/cm", siUnit: "N", factor: GRAM_FORCE_N },
  G: { kesUnit: "gf/(cm·degree)", siUnit: "N/m per radian", factor: (GRAM_FORCE_N / 1e-2) * (180 / Math.PI) },
  "2HG": { kesUnit: "gf/cm", siUnit: "N/m", factor: GRAM_FORCE_N / 1e-2 },
  "2HG5": { kesUnit: "gf/cm", siUnit: "N/m", factor: GRAM_FORCE_N / 1e-2 },
  WT: { kesUnit: "gf·cm/cm²", siUnit: "J/m²", factor: (GRAM_FORCE_N * 1e-2) / 1e-4 },
  EMT_LOAD: { kesUnit: "gf/cm", siUnit: "N/m", factor: GRAM_FORCE_N / 1e-2 },
  W: { kesUnit: "mg/cm²", siUnit: "g/m²", factor: 10 },
} as const;

/** One KES-F quantity name. */
export type KesQuantity = keyof typeof KES_TO_SI;

/** Converts a KES-F reading to SI using KES_TO_SI. */
export function kesToSi(quantity: KesQuantity, value: number): number {
  return value * KES_TO_SI[quantity].factor;
}

// ---------------------------------------------------------------------------------------------------------
// Recorded tests → simulation values

/** One recorded fabric test. All lengths mm, masses g. */
export type FabricTest =
  | { id: string; kind: "mass"; massG: number; lengthMm: number; widthMm: number }
  | { id: string; kind: "thickness"; thicknessMm: number }
  | {
      id: string;
      kind: "bending";
      direction: FabricDirection;
      overhangMm: number;
      /** Incline angle; D1388's 41.5° when omitted. Other angles use Peirce's formula. */
      angleDeg?: number;
    }
  | ({ id: string; kind: "stretch"; direction: FabricDirection } & StripReading)
  | { id: string; kind: "kes_shear"; /** KES G, gf/(cm·degree) */ shearRigidity: number }
  | { id: string; kind: "friction"; /** incline angle at which sliding starts */ slideAngleDeg: number };

/** A simulation value with where it came from. */
export type TaggedValue<U extends string> =
  | {
      value: number;
      unit: U;
      basis: "measured";
      /** The first test used (kept for simple links). */
      testId: string;
      /** Every test averaged into this value. */
      testIds: string[];
      note?: string;
    }
  | { value: number; unit: U; basis: "assumed"; note: string };

/** SI values for a cloth simulator. */
export interface FabricSimulationValues {
  massPerArea: TaggedValue<"kg/m²">;
  bendingStiffness: Record<FabricDirection, TaggedValue<"N·m">>;
  stretchStiffness: Record<FabricDirection, TaggedValue<"N/m">>;
  thickness: TaggedValue<"m">;
  /** Only when a shear test is recorded. */
  shearStiffness?: TaggedValue<"N/m/rad">;
  /** Only when a friction test is recorded. */
  friction?: TaggedValue<"1">;
}

/** Broad fabric classes that carry default values when a test is missing. */
export type FabricClass = "woven_light" | "woven_medium" | "woven_heavy" | "knit_light" | "knit_medium" | "knit_heavy";

/** Default inputs per class, in the units a workroom records. */
export interface FabricClassDefaults {
  massPerAreaGsm: number;
  bendingLengthMm: Record<FabricDirection, number>;
  stretchStiffnessNPerM: Record<FabricDirection, number>;
  thicknessMm: number;
}

// Common practice, no source: placeholders so a simulation can start before a test is recorded.
// Mass bands follow retailer guidance (light < 150, medium 150–350, heavy > 350 g/m²; retailer guidance, common practice, no source);
// bending lengths, stretch stiffnesses and thicknesses are hand-picked typical values. Knit "weft" = courses,
// usually the stretchier direction.
/** Default values per fabric class (common practice, no source). */
export const FABRIC_CLASS_DEFAULTS: Record<FabricClass, FabricClassDefaults> = {
  woven_light: {
    massPerAreaGsm: 90,
    bendingLengthMm: { warp: 15, weft: 14 },
    stretchStiffnessNPerM: { warp: 8000, weft: 6000 },
    thicknessMm: 0.15,
  },
  woven_medium: {
    massPerAreaGsm: 200,
    bendingLengthMm: { warp: 22, weft: 20 },
    stretchStiffnessNPerM: { warp: 15000, weft: 12000 },
    thicknessMm: 0.35,
  },
  woven_heavy: {
    massPerAreaGsm: 400,
    bendingLengthMm: { warp: 32, weft: 30 },
    stretchStiffnessNPerM: { warp: 40000, weft: 30000 },
    thicknessMm: 0.8,
  },
  knit_light: {
    massPerAreaGsm: 130,
    bendingLengthMm: { warp: 12, weft: 10 },
    stretchStiffnessNPerM: { warp: 300, weft: 150 },
    thicknessMm: 0.45,
  },
  knit_medium: {
    massPerAreaGsm: 220,
    bendingLengthMm: { warp: 16, weft: 13 },
    stretchStiffnessNPerM: { warp: 600, weft: 300 },
    thicknessMm: 0.8,
  },
  knit_heavy: {
    massPerAreaGsm: 320,
    bendingLengthMm: { warp: 20, weft: 17 },
    stretchStiffnessNPerM: { warp: 1200, weft: 600 },
    thicknessMm: 1.4,
  },
};

/** What is known about a fabric. */
export interface FabricPhysicsInput {
  /** Class whose defaults fill values no test covers. */
  fabricClass: FabricClass;
  /** Mass per area on the fabric record (e.g. from the supplier), g/m²; used when no mass test exists. */
  declaredMassPerAreaGsm?: number;
  /** Recorded tests; several of one kind (and direction) are averaged. */
  tests: readonly FabricTest[];
}

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const NO_SOURCE = "common practice, no source";

/**
 * Turns a fabric's recorded tests into SI simulation values, each tagged measured (with test ids) or assumed.
 * Several mass specimens are pooled (total mass / total area, as D3776 option C pools specimens); bending
 * lengths are averaged per direction before cubing; stretch stiffnesses are averaged per direction.
 */
export function fabricSimulationValues(input: FabricPhysicsInput): FabricSimulationValues {
  const d = FABRIC_CLASS_DEFAULTS[input.fabricClass];
  const of = <K extends FabricTest["kind"]>(kind: K) => input.tests.filter((t): t is Extract<FabricTest, { kind: K }> => t.kind === kind);
  const ids = (ts: readonly { id: string }[]) => ts.map((t) => t.id);
  const measured = <U extends string>(value: number, unit: U, ts: readonly { id: string }[], note?: string): TaggedValue<U> => ({
    value,
    unit,
    basis: "measured",
    testId: ts[0].id,
    testIds: ids(ts),
    ...(note ? { note } : {}),
  });

  // Mass per area first: bending needs it.
  const massTests = of("mass");
  let gsm: number;
  let massPerAreaValue: TaggedValue<"kg/m²">;
  let gsmNote: string | undefined;
  if (massTests.length > 0) {
    const totalMass = massTests.reduce((s, t) => s + t.massG, 0);
    const totalAreaMm2 = massTests.reduce((s, t) => s + t.lengthMm * t.widthMm, 0);
    gsm = massPerArea(totalMass, totalAreaMm2, 1).gPerM2;
    massPerAreaValue = measured(gsm / 1000, "kg/m²", massTests);
  } else if (input.declaredMassPerAreaGsm !== undefined) {
    positive({ declaredMassPerAreaGsm: input.declaredMassPerAreaGsm });
    gsm = input.declaredMassPerAreaGsm;
    gsmNote = `mass per area ${gsm} g/m² from the fabric record, not tested`;
    massPerAreaValue = { value: gsm / 1000, unit: "kg/m²", basis: "assumed", note: gsmNote };
  } else {
    gsm = d.massPerAreaGsm;
    gsmNote = `${input.fabricClass} default ${gsm} g/m² (${NO_SOURCE})`;
    massPerAreaValue = { value: gsm / 1000, unit: "kg/m²", basis: "assumed", note: gsmNote };
  }

  const bending = (dir: FabricDirection): TaggedValue<"N·m"> => {
    const ts = of("bending").filter((t) => t.direction === dir);
    if (ts.length === 0) {
      const c = d.bendingLengthMm[dir];
      return {
        value: flexuralRigidity(d.massPerAreaGsm, c),
        unit: "N·m",
        basis: "assumed",
        note: `${input.fabricClass} default: bending length ${c} mm at ${d.massPerAreaGsm} g/m² (${NO_SOURCE})`,
      };
    }
    const c = mean(
      ts.map((t) =>
        t.angleDeg === undefined || t.angleDeg === D1388_CANTILEVER_ANGLE_DEG
          ? bendingLengthFromOverhang(t.overhangMm)
          : peirceBendingLength(t.overhangMm, t.angleDeg),
      ),
    );
    return measured(flexuralRigidity(gsm, c), "N·m", ts, gsmNote ? `uses ${gsmNote}` : undefined);
  };

  const stretch = (dir: FabricDirection): TaggedValue<"N/m"> => {
    const ts = of("stretch").filter((t) => t.direction === dir);
    if (ts.length === 0) {
      return {
        value: d.stretchStiffnessNPerM[dir],
        unit: "N/m",
        basis: "assumed",
        note: `${input.fabricClass} default (${NO_SOURCE})`,
      };
    }
    return measured(mean(ts.map(tensileStiffnessPerWidth)), "N/m", ts);
  };

  const thicknessTests = of("thickness");
  const thickness: TaggedValue<"m"> =
    thicknessTests.length > 0
      ? measured(mean(thicknessTests.map((t) => t.thicknessMm)) / 1000, "m", thicknessTests)
      : { value: d.thicknessMm / 1000, unit: "m", basis: "assumed", note: `${input.fabricClass} default (${NO_SOURCE})` };

  const result: FabricSimulationValues = {
    massPerArea: massPerAreaValue,
    bendingStiffness: { warp: bending("warp"), weft: bending("weft") },
    stretchStiffness: { warp: stretch("warp"), weft: stretch("weft") },
    thickness,
  };
  const shear = of("kes_shear");
  if (shear.length > 0) result.shearStiffness = measured(mean(shear.map((t) => kesToSi("G", t.shearRigidity))), "N/m/rad", shear);
  const friction = of("friction");
  if (friction.length > 0) result.friction = measured(mean(friction.map((t) => frictionFromSlideAngle(t.slideAngleDeg))), "1", friction);
  return result;
}

// Inputs are physical sizes; zero or negative ones are always data-entry errors.
function positive(values: Record<string, number>): void {
  for (const [name, v] of Object.entries(values)) {
    if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${name} must be a positive number, got ${v}`);
  }
}
