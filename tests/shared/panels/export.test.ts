// @vitest-environment jsdom
import { describe, expect, it } from "vitest";
import { polygonArea as d3Area } from "d3-polygon";
import { objGroupName, panelsToJson, panelsToObj, panelsToSvg, type SeamRef } from "@shared/domain/panels/export";
import { markerToSvg, nestPieces } from "@shared/domain/panels/nesting";
import type { PanelShape, Point } from "@shared/domain/panels/geometry";

// Hand-worked panels: a 300 × 400 front drawn counter-clockwise and a 280 × 402 back drawn clockwise.
const front: PanelShape = {
  id: "front",
  name: "Front bodice",
  outline: [
    [0, 0],
    [300, 0],
    [300, 400],
    [0, 400],
  ],
  grainline: [
    [150, 50],
    [150, 350],
  ],
  notches: [{ point: [300, 100], edge: 1 }],
  seamAllowanceMm: 10,
  cutCount: 2,
  mirrored: true,
};
const back: PanelShape = {
  id: "back",
  name: "Back bodice",
  outline: [
    [0, 0],
    [0, 402],
    [280, 402],
    [280, 0],
  ],
  cutCount: 1,
};
// Side seam: front edge 1 from (300,0) up to (300,400), through the notch at (300,100);
// back edge 0 from (0,0) up to (0,402). Plus a notch-to-corner run on the front.
const seams: SeamRef[] = [
  { id: "side", a: { panelId: "front", from: 1, to: 2 }, b: { panelId: "back", from: 0, to: 1 } },
  {
    id: "hem-part",
    a: { panelId: "front", from: { edge: 0, t: 0.5 }, to: 1 },
    b: { panelId: "back", from: 3, to: 0, direction: "forward" },
  },
];

interface ParsedObj {
  groups: { name: string; faces: number[][] }[];
  v: [number, number, number][];
  vt: [number, number][];
}

/** A small Wavefront OBJ reader written from the format's line syntax (v, vt, g, f with v/vt pairs). */
function readObj(text: string): ParsedObj {
  const out: ParsedObj = { groups: [], v: [], vt: [] };
  for (const line of text.split("\n")) {
    const [tag, ...rest] = line.trim().split(/\s+/);
    if (tag === "v") out.v.push(rest.map(Number) as [number, number, number]);
    else if (tag === "vt") out.vt.push(rest.map(Number) as [number, number]);
    else if (tag === "g") out.groups.push({ name: rest.join(" "), faces: [] });
    else if (tag === "f") {
      const idx = rest.map((r) => r.split("/").map(Number));
      for (const [v, t] of idx) expect(v).toBe(t);
      out.groups.at(-1)!.faces.push(idx.map(([v]) => v));
    }
  }
  return out;
}

describe("panelsToObj", () => {
  it("writes one flat group per panel whose triangles cover the panel's area, with UVs equal to positions", () => {
    const { obj } = panelsToObj([front, back], seams);

    const parsed = readObj(obj);
    expect(parsed.groups.map((g) => g.name)).toEqual(["Front_bodice", "Back_bodice"]);
    expect(parsed.v.every(([, , z]) => z === 0)).toBe(true);
    parsed.v.forEach(([x, y], i) => expect(parsed.vt[i]).toEqual([x, y]));
    [front, back].forEach((panel, gi) => {
      let sum = 0;
      for (const [a, b, c] of parsed.groups[gi].faces) {
        const [pa, pb, pc] = [a, b, c].map((k) => parsed.v[k - 1]);
        const cross = (pb[0] - pa[0]) * (pc[1] - pa[1]) - (pc[0] - pa[0]) * (pb[1] - pa[1]);
        // Counter-clockwise seen from +z, so normals face the viewer.
        expect(cross).toBeGreaterThan(0);
        sum += cross / 2;
      }
      // Polygon area from d3-polygon (d3-polygon library), mm² → m².
      const expected = Math.abs(d3Area(panel.outline.map(([x, y]) => [x, y] as [number, number]))) / 1e6;
      expect(sum).toBeCloseTo(expected, 12);
    });
  });

  it("maps each seam side to the OBJ vertices along its run, with mid-edge ends inserted as vertices", () => {
    const { obj, seams: map } = panelsToObj([front, back], seams);

    const { v } = readObj(obj);
    const pts = (ids: number[]) => ids.map((k) => [v[k - 1][0], v[k - 1][1]] as Point);
    const side = map.seams[0];
    // Row layout: the front stays at its origin; the back starts 300 + 50 mm to the right.
    // The front side seam passes its notch at (0.3, 0.1) m, which became a vertex.
    expect(side.a.group).toBe("Front_bodice");
    expect(pts(side.a.vertices)).toEqual([
      [0.3, 0],
      [0.3, 0.1],
      [0.3, 0.4],
    ]);
    expect(pts(side.b.vertices)).toEqual([
      [0.35, 0],
      [0.35, 0.402],
    ]);
    const hem = map.seams[1];
    expect(pts(hem.a.vertices)).toEqual([
      [0.15, 0],
      [0.3, 0],
    ]);
    expect(pts(hem.b.vertices)).toEqual([
      [0.63, 0],
      [0.35, 0],
    ]);
  });

  it("keeps drafted coordinates when asked and rejects seams naming unknown panels", () => {
    const { obj } = panelsToObj([back], [], { layout: "as-drafted" });

    expect(readObj(obj).v[1]).toEqual([0, 0.402, 0]);
    expect(() => panelsToObj([front], [seams[0]])).toThrow(/unknown panel back/);
    expect(objGroupName({ ...back, name: "  Under  collar " })).toBe("Under_collar");
  });
});

describe("panelsToSvg and panelsToJson", () => {
  it("draws sew line, dashed cut line, grainline and notch for each panel in well-formed SVG", () => {
    const svg = panelsToSvg([front, { ...back, name: "Back <CB>" }]);

    const doc = new DOMParser().parseFromString(svg, "image/svg+xml");
    expect(doc.getElementsByTagName("parsererror")).toHaveLength(0);
    const groups = doc.querySelectorAll("g[data-panel]");
    expect(groups).toHaveLength(2);
    expect(groups[0].querySelectorAll("path")).toHaveLength(2);
    expect(groups[0].querySelectorAll("path[stroke-dasharray]")).toHaveLength(1);
    expect(groups[0].querySelectorAll("line")).toHaveLength(2);
    expect(groups[1].querySelectorAll("path")).toHaveLength(1);
    expect(groups[1].textContent).toContain("Back <CB>");
  });

  it("serialises panels as JSON that parses back to the same data", () => {
    const parsed = JSON.parse(panelsToJson([front, back]));

    expect(parsed).toMatchObject({ version: 1, units: "mm", yAxis: "up" });
    expect(parsed.panels).toEqual(JSON.parse(JSON.stringify([front, back])));
  });
});

describe("markerToSvg", () => {
  it("draws one path per placed copy in a well-formed SVG document", () => {
    const rect: Point[] = [
      [0, 0],
      [260, 0],
      [260, 70],
      [0, 70],
    ];
    const result = nestPieces([{ id: "a", name: "Cuff <A>", outline: rect, cutCount: 3 }], { usableWidthMm: 1450 });

    const svg = markerToSvg(result);

    const doc = new DOMParser().parseFromString(svg, "image/svg+xml");
    expect(doc.getElementsByTagName("parsererror")).toHaveLength(0);
    expect(doc.querySelectorAll("g[data-piece] path")).toHaveLength(3);
    expect(svg).toContain("Cuff &lt;A&gt;");
  });
});
