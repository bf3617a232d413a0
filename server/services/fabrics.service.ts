import { type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import { Fabric, FabricTest, User } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type {
  CreateFabricInput,
  CreateFabricTestInput,
  FabricDetailDto,
  FabricTestDerived,
  FabricTestReadings,
  UpdateFabricInput,
} from "@shared/schemas/fabrics.js";
import {
  D1388_CANTILEVER_ANGLE_DEG,
  bendingLengthFromOverhang,
  fabricSimulationValues,
  flexuralRigidity,
  massPerArea,
  peirceBendingLength,
  tensileStiffnessPerWidth,
  type FabricClass,
  type FabricTest as PhysicsTest,
  type TaggedValue,
} from "@shared/domain/fabric-physics.js";
import { gsmToOzPerSqYd } from "@shared/domain/units.js";
import { greyScaleChangeCielab, greyScaleLabel, shrinkageResult, type GreyScaleGrade } from "@shared/domain/fabric-care-tests.js";
import { deletePhotosOfOwners, removeUnreferencedFiles } from "./photos.service.js";

const countAttrs = {
  include: [
    [sequelize.literal(`(SELECT count(*) FROM fabric_tests t WHERE t.fabric_id = "Fabric"."id")`), "testCount"],
    [sequelize.literal(`(SELECT count(*) FROM garments g WHERE g.fabric_id = "Fabric"."id")`), "garmentCount"],
  ] as [ReturnType<typeof sequelize.literal>, string][],
};

/** The production's fabrics by name, with test and garment counts. */
export async function listFabrics(actor: Actor): Promise<Fabric[]> {
  return Fabric.findAll({ where: { productionId: actor.productionId }, attributes: countAttrs, order: [["name", "ASC"]] });
}

async function loadFabric(actor: Actor, id: string, transaction?: Transaction): Promise<Fabric> {
  const f = await Fabric.findOne({ where: { id, productionId: actor.productionId }, attributes: countAttrs, transaction });
  if (!f) throw NotFoundError("Fabric not found.");
  return f;
}

/** Pooled mass per area of a fabric's mass tests (total mass / total area, as D3776 option C pools specimens). */
function pooledMassGsm(tests: FabricTest[]): number | null {
  const mass = tests.filter((t) => t.readings.kind === "mass").map((t) => t.readings as Extract<FabricTestReadings, { kind: "mass" }>);
  if (mass.length === 0) return null;
  const totalMass = mass.reduce((s, r) => s + r.massG, 0);
  const totalArea = mass.reduce((s, r) => s + r.lengthMm * r.widthMm, 0);
  return massPerArea(totalMass, totalArea, 1).gPerM2;
}

/** Derived values for one test's readings (SI, plus g/m² and oz/yd² for mass). */
function derive(r: FabricTestReadings, massGsm: { value: number; basis: "tested" | "declared" } | null): FabricTestDerived {
  switch (r.kind) {
    case "mass": {
      const m = massPerArea(r.massG, r.lengthMm, r.widthMm);
      return { massPerAreaGsm: m.gPerM2, massPerAreaKgM2: m.kgPerM2, massPerAreaOzYd2: gsmToOzPerSqYd(m.gPerM2) };
    }
    case "cantilever": {
      const c =
        r.angleDeg === D1388_CANTILEVER_ANGLE_DEG ? bendingLengthFromOverhang(r.overhangMm) : peirceBendingLength(r.overhangMm, r.angleDeg);
      if (!massGsm) return { bendingLengthMm: c };
      const g = flexuralRigidity(massGsm.value, c);
      return {
        bendingLengthMm: c,
        flexuralRigidityNm: g,
        flexuralRigidityMicroNm: g * 1e6,
        massBasis: massGsm.basis,
        massPerAreaUsedGsm: massGsm.value,
      };
    }
    case "strip": {
      const k = tensileStiffnessPerWidth(r);
      return { strain: r.extensionMm / r.gaugeLengthMm, forcePerWidthNPerM: r.loadN / (r.stripWidthMm / 1000), tensileStiffnessNPerM: k };
    }
    case "thickness":
      return { thicknessM: r.thicknessMm / 1000 };
    case "shrinkage": {
      const x = shrinkageResult(r.length, r.width);
      return {
        lengthChangePct: x.lengthChangePct,
        widthChangePct: x.widthChangePct,
        lengthCutFactor: x.lengthCutFactor,
        widthCutFactor: x.widthCutFactor,
      };
    }
    case "colourfastness": {
      const cielab = greyScaleChangeCielab[r.changeGrade as GreyScaleGrade];
      return {
        changeLabel: greyScaleLabel(r.changeGrade as GreyScaleGrade),
        changeDeltaE: cielab.deltaE,
        changeDeltaETolerance: cielab.tolerance,
        stainingLabel: r.stainingGrade === null ? null : greyScaleLabel(r.stainingGrade as GreyScaleGrade),
      };
    }
    case "flame_retardancy":
      // A record of a treatment and its certificate: nothing to compute.
      return {};
  }
}

function massBasisFor(fabric: Fabric, tests: FabricTest[]): { value: number; basis: "tested" | "declared" } | null {
  const tested = pooledMassGsm(tests);
  if (tested !== null) return { value: tested, basis: "tested" };
  if (fabric.massPerAreaGsm !== null) return { value: fabric.massPerAreaGsm, basis: "declared" };
  return null;
}

/** Recomputes every test's derived values (a new mass test changes the rigidity of the bending tests). */
async function recomputeDerived(fabric: Fabric, transaction: Transaction): Promise<void> {
  const tests = await FabricTest.findAll({ where: { fabricId: fabric.id }, transaction });
  const basis = massBasisFor(fabric, tests);
  for (const t of tests) {
    const d = derive(t.readings, basis);
    if (JSON.stringify(d) !== JSON.stringify(t.derived)) await t.update({ derived: d }, { transaction });
  }
}

/** Creates a fabric. */
export async function createFabric(actor: Actor, input: CreateFabricInput): Promise<Fabric> {
  const id = await sequelize.transaction(async (transaction) => {
    const f = await Fabric.create({ ...input, productionId: actor.productionId }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fabric.create",
        entityType: "fabric",
        entityId: f.id,
        after: input,
      },
      transaction,
    );
    return f.id;
  });
  return loadFabric(actor, id);
}

/** Edits a fabric; a changed declared weight updates its bending tests' rigidity. */
export async function updateFabric(actor: Actor, id: string, input: UpdateFabricInput): Promise<Fabric> {
  await sequelize.transaction(async (transaction) => {
    const f = await Fabric.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!f) throw NotFoundError("Fabric not found.");
    const before = f.toJSON();
    await f.update(input, { transaction });
    if (input.massPerAreaGsm !== undefined) await recomputeDerived(f, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fabric.update",
        entityType: "fabric",
        entityId: f.id,
        before,
        after: input,
      },
      transaction,
    );
  });
  return loadFabric(actor, id);
}

/** Deletes a fabric and its tests; garments keep existing without a fabric. */
export async function deleteFabric(actor: Actor, id: string): Promise<void> {
  let hashes: string[] = [];
  await sequelize.transaction(async (transaction) => {
    const f = await Fabric.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!f) throw NotFoundError("Fabric not found.");
    const tests = await FabricTest.findAll({ where: { fabricId: id }, attributes: ["id"], transaction });
    hashes = [
      ...(await deletePhotosOfOwners(
        actor.productionId,
        "fabric_test",
        tests.map((t) => t.id),
        transaction,
      )),
      ...(await deletePhotosOfOwners(actor.productionId, "fabric", [id], transaction)),
    ];
    await f.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fabric.delete",
        entityType: "fabric",
        entityId: id,
        before: f.toJSON(),
      },
      transaction,
    );
  });
  await removeUnreferencedFiles(hashes);
}

function classOf(construction: "woven" | "knit", gsm: number | null): FabricClass {
  // Weight bands from retailer guidance (common practice, no source): light < 150, medium 150–350, heavy > 350 g/m².
  const band = gsm === null ? "medium" : gsm < 150 ? "light" : gsm <= 350 ? "medium" : "heavy";
  return `${construction}_${band}` as FabricClass;
}

/** The test as the physics module reads it; care tests (shrinkage, colour, flame) are not physics. */
function toPhysics(t: FabricTest): PhysicsTest | null {
  const r = t.readings;
  switch (r.kind) {
    case "mass":
      return { id: t.id, kind: "mass", massG: r.massG, lengthMm: r.lengthMm, widthMm: r.widthMm };
    case "cantilever":
      return { id: t.id, kind: "bending", direction: r.direction, overhangMm: r.overhangMm, angleDeg: r.angleDeg };
    case "strip":
      return {
        id: t.id,
        kind: "stretch",
        direction: r.direction,
        loadN: r.loadN,
        stripWidthMm: r.stripWidthMm,
        gaugeLengthMm: r.gaugeLengthMm,
        extensionMm: r.extensionMm,
      };
    case "thickness":
      return { id: t.id, kind: "thickness", thicknessMm: r.thicknessMm };
    default:
      return null;
  }
}

const sim = <U extends string>(v: TaggedValue<U>) => ({
  value: v.value,
  unit: v.unit,
  basis: v.basis,
  ...(v.note ? { note: v.note } : {}),
});

/** A fabric with its tests and the SI simulation values they give. */
export async function getFabricDetail(
  actor: Actor,
  id: string,
): Promise<{ fabric: Fabric; tests: FabricTest[]; simulation: FabricDetailDto["simulation"] }> {
  const fabric = await loadFabric(actor, id);
  const tests = await FabricTest.findAll({
    where: { fabricId: id, productionId: actor.productionId },
    include: [{ model: User, as: "tester", attributes: ["id", "name"] }],
    order: [
      ["testedOn", "DESC"],
      ["createdAt", "DESC"],
    ],
  });
  const fabricClass = classOf(fabric.construction, pooledMassGsm(tests) ?? fabric.massPerAreaGsm);
  const s = fabricSimulationValues({
    fabricClass,
    declaredMassPerAreaGsm: fabric.massPerAreaGsm ?? undefined,
    tests: tests.map(toPhysics).filter((x): x is PhysicsTest => x !== null),
  });
  return {
    fabric,
    tests,
    simulation: {
      fabricClass,
      massPerArea: sim(s.massPerArea),
      bendingStiffness: { warp: sim(s.bendingStiffness.warp), weft: sim(s.bendingStiffness.weft) },
      stretchStiffness: { warp: sim(s.stretchStiffness.warp), weft: sim(s.stretchStiffness.weft) },
      thickness: sim(s.thickness),
    },
  };
}

/** Records a test with its raw readings and derived values (ASTM D3776, D1388, strip stiffness). */
export async function addFabricTest(actor: Actor, fabricId: string, input: CreateFabricTestInput): Promise<FabricTest> {
  const id = await sequelize.transaction(async (transaction) => {
    const fabric = await Fabric.findOne({
      where: { id: fabricId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!fabric) throw NotFoundError("Fabric not found.");
    const existing = await FabricTest.findAll({ where: { fabricId }, transaction });
    if (input.readings.kind === "cantilever" && !massBasisFor(fabric, existing)) {
      // D1388's rigidity needs the cloth's mass per area; without it the test would be half-recorded.
      throw ValidationError("readings.overhangMm: record a mass test or the fabric's mass per area first; flexural rigidity needs it", {
        "readings.overhangMm": "record a mass test or the fabric's mass per area first; flexural rigidity needs it",
      });
    }
    const r = input.readings;
    const t = await FabricTest.create(
      {
        productionId: actor.productionId,
        fabricId,
        kind: r.kind,
        direction: r.kind === "cantilever" || r.kind === "strip" ? r.direction : null,
        readings: r,
        derived: {},
        testedBy: actor.user.id,
        testedOn: input.testedOn,
        notes: input.notes,
      },
      { transaction },
    );
    await recomputeDerived(fabric, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fabric.test_add",
        entityType: "fabric_test",
        entityId: t.id,
        after: input,
      },
      transaction,
    );
    return t.id;
  });
  return (await FabricTest.findByPk(id, { include: [{ model: User, as: "tester", attributes: ["id", "name"] }] }))!;
}

/** Removes a test (a mis-entered reading) and recomputes the others. */
export async function deleteFabricTest(actor: Actor, fabricId: string, testId: string): Promise<void> {
  let hashes: string[] = [];
  await sequelize.transaction(async (transaction) => {
    const fabric = await Fabric.findOne({
      where: { id: fabricId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!fabric) throw NotFoundError("Fabric not found.");
    const t = await FabricTest.findOne({ where: { id: testId, fabricId }, transaction });
    if (!t) throw NotFoundError("Test not found.");
    // A certificate photo goes with its test.
    hashes = await deletePhotosOfOwners(actor.productionId, "fabric_test", [t.id], transaction);
    await t.destroy({ transaction });
    await recomputeDerived(fabric, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fabric.test_delete",
        entityType: "fabric_test",
        entityId: testId,
        before: t.toJSON(),
      },
      transaction,
    );
  });
  await removeUnreferencedFiles(hashes);
}

/** Recomputes derived values for every test of a fabric (used by demo data after loading raw readings). */
export async function recomputeFabricTests(fabricId: string, transaction: Transaction): Promise<void> {
  const fabric = await Fabric.findByPk(fabricId, { transaction });
  if (fabric) await recomputeDerived(fabric, transaction);
}
