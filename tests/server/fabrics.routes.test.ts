import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { Fabric, FabricTest } from "../../server/models/index.js";
import { buildFabric, buildMember } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let base: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("cutter");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  base = `/api/productions/${production.id}/fabrics`;
});

const calico = {
  name: "Calico",
  fibreContent: [{ fibre: "cotton", percent: 100 }],
  construction: "woven",
  widthMm: 1500,
  massPerAreaGsm: 135,
};

describe("POST /fabrics", () => {
  it("400 naming fibreContent when percentages do not add to 100, and writes nothing", async () => {
    const res = await agent.post(base, {
      ...calico,
      fibreContent: [
        { fibre: "wool", percent: 60 },
        { fibre: "polyester", percent: 30 },
      ],
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.fibreContent).toMatch(/add up to 100/);
    expect(await Fabric.count()).toBe(0);
  });

  it("400 naming widthMm for a negative width, and writes nothing", async () => {
    const res = await agent.post(base, { ...calico, widthMm: -1500 });

    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("widthMm");
    expect(await Fabric.count()).toBe(0);
  });

  it("creates a fabric and shows oz/yd² beside g/m²", async () => {
    const res = await agent.post(base, {
      ...calico,
      fibreContent: [
        { fibre: "wool", percent: 33.3 },
        { fibre: "linen", percent: 33.3 },
        { fibre: "cotton", percent: 33.4 },
      ],
    });

    expect(res.status).toBe(201);
    // NIST SP 811 App. B.8, 1959 international yard and pound: 1 g/m² ≈ 0.0294935246816 oz/yd², so 135 g/m² → 3.98 oz/yd² (ASTM D3776/D3776M-20 gives 3.98163).
    expect(res.body.data.massPerAreaOzYd2).toBe(3.98);
  });
});

describe("POST /fabrics/:id/tests", () => {
  it("mass test: ASTM D3776 m/A — 1.35 g on 100 × 100 mm → 135 g/m² = 3.98163 oz/yd² (ASTM D3776/D3776M-20)", async () => {
    const f = await buildFabric({ production });

    const res = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "mass", massG: 1.35, lengthMm: 100, widthMm: 100 },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.readings).toEqual({ kind: "mass", massG: 1.35, lengthMm: 100, widthMm: 100 });
    expect(res.body.data.derived.massPerAreaGsm).toBeCloseTo(135, 9);
    expect(res.body.data.derived.massPerAreaOzYd2).toBeCloseTo(3.98163, 5);
  });

  it("cantilever: ASTM D1388 worked example W = 200 g/m², overhang 40 mm → c = 20 mm, G = 15.69064 µN·m (ASTM D1388-18)", async () => {
    const f = await buildFabric({ production, massPerAreaGsm: null });
    await agent
      .post(`${base}/${f.id}/tests`, { testedOn: "2026-11-20", readings: { kind: "mass", massG: 2, lengthMm: 100, widthMm: 100 } })
      .expect(201);

    const res = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "cantilever", direction: "warp", overhangMm: 40 },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.readings.angleDeg).toBe(41.5);
    expect(res.body.data.derived.bendingLengthMm).toBe(20);
    expect(res.body.data.derived.flexuralRigidityMicroNm).toBeCloseTo(15.69064, 5);
    expect(res.body.data.derived.massBasis).toBe("tested");
  });

  it("strip test: b = 50 mm, L₀ = 200 mm, 10 N at 4 mm → k = 10 000 N/m (strip test, Hooke's law per unit width)", async () => {
    const f = await buildFabric({ production });

    const res = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "strip", direction: "weft", loadN: 10, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.derived.tensileStiffnessNPerM).toBeCloseTo(10_000, 6);
    expect(res.body.data.derived.strain).toBeCloseTo(0.02, 12);
  });

  it("a later mass test recomputes the rigidity of earlier bending tests (declared → tested weight)", async () => {
    const f = await buildFabric({ production, massPerAreaGsm: 280 });
    const bend = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "cantilever", direction: "weft", overhangMm: 40 },
    });
    expect(bend.body.data.derived.massBasis).toBe("declared");

    await agent
      .post(`${base}/${f.id}/tests`, { testedOn: "2026-11-21", readings: { kind: "mass", massG: 2, lengthMm: 100, widthMm: 100 } })
      .expect(201);

    const t = await FabricTest.findByPk(bend.body.data.id);
    expect(t!.derived.massBasis).toBe("tested");
    expect(t!.derived.flexuralRigidityMicroNm).toBeCloseTo(15.69064, 5);
    const detail = await agent.get(`${base}/${f.id}`);
    expect(detail.body.data.simulation.bendingStiffness.weft.basis).toBe("measured");
    expect(detail.body.data.simulation.bendingStiffness.weft.value).toBeCloseTo(15.69064e-6, 10);
    expect(detail.body.data.simulation.massPerArea.value).toBeCloseTo(0.2, 12);
  });

  it("400 for a cantilever test when no mass per area is known, nothing written", async () => {
    const f = await buildFabric({ production, massPerAreaGsm: null });

    const res = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "cantilever", direction: "warp", overhangMm: 40 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["readings.overhangMm"]).toMatch(/mass/);
    expect(await FabricTest.count()).toBe(0);
  });

  it("400 naming the reading for a negative specimen length", async () => {
    const f = await buildFabric({ production });

    const res = await agent.post(`${base}/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "mass", massG: 1, lengthMm: -100, widthMm: 100 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["readings.lengthMm"]).toMatch(/greater than 0/);
    expect(await FabricTest.count()).toBe(0);
  });
});
