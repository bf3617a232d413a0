/**
 * Invented flat patterns for the demo digital double: Elias Marr's 1920s keeper's working clothes
 * (sack jacket, collarless work shirt, high-waisted trousers). Sew lines in mm, y up, grain along y.
 * Pure data, so a test can check that every seam matches.
 */
import type { Point } from "../shared/domain/panels/geometry.js";

type Pt = [number, number];

/** Samples a quadratic Bézier from a to b with control c (excluding a, including b). */
function curve(a: Pt, c: Pt, b: Pt, steps = 6): Pt[] {
  const out: Pt[] = [];
  for (let i = 1; i <= steps; i++) {
    const t = i / steps;
    const u = 1 - t;
    out.push([
      Math.round((u * u * a[0] + 2 * u * t * c[0] + t * t * b[0]) * 100) / 100,
      Math.round((u * u * a[1] + 2 * u * t * c[1] + t * t * b[1]) * 100) / 100,
    ]);
  }
  return out;
}

/** Index of a point in an outline (exact match), so seams can name vertices by position. */
function at(outline: Pt[], p: Pt): number {
  const i = outline.findIndex((q) => q[0] === p[0] && q[1] === p[1]);
  if (i < 0) throw new Error(`point ${p} not on outline`);
  return i;
}

export interface DemoPanel {
  key: string;
  garment: "jacket" | "shirt" | "trousers";
  name: string;
  outline: Pt[];
  grainline: [Pt, Pt];
  notches: { point: Pt; edge: number }[];
  seamAllowanceMm: number;
  cutCount: number;
  mirrored: boolean;
  grainMode: "straight" | "bias" | "free";
}

export interface DemoSeam {
  key: string;
  name: string;
  a: { panel: string; from: number; to: number; direction: "forward" | "backward" };
  b: { panel: string; from: number; to: number; direction: "forward" | "backward" };
  eased: { minMm: number; maxMm: number } | null;
}

const panel = (p: Omit<DemoPanel, "notches" | "seamAllowanceMm" | "grainMode"> & Partial<DemoPanel>): DemoPanel => ({
  notches: [],
  seamAllowanceMm: 10,
  grainMode: "straight",
  ...p,
});

// ---- Keeper's jacket (wool melton) -------------------------------------------------------------
const jFrontArm = curve([295, 470], [228, 520], [225, 720]);
const jacketFront: Pt[] = [[0, 0], [300, 0], [295, 470], ...jFrontArm, [95, 750], ...curve([95, 750], [90, 660], [0, 650])];
const jBackArm = curve([285, 470], [222, 530], [215, 735]);
const jacketBack: Pt[] = [[0, 0], [290, 0], [285, 470], ...jBackArm, [80, 760], ...curve([80, 760], [40, 748], [0, 750])];
// One-piece sleeve, symmetric: the cap's front half goes into the front armhole, its back half into the back.
const capTop: Pt = [165, 655];
const jacketSleeve: Pt[] = [
  [35, 0],
  [295, 0],
  [330, 460],
  ...curve([330, 460], [318, 655], capTop, 8),
  ...curve(capTop, [12, 655], [0, 460], 8),
];
const jacketCollar: Pt[] = [[0, 0], ...curve([0, 0], [230, -25], [460, 0], 8), [450, 85], ...curve([450, 85], [230, 60], [10, 85], 8)];
const jacketPocket: Pt[] = [
  [0, 40],
  ...curve([0, 40], [0, 0], [40, 0], 4),
  [130, 0],
  ...curve([130, 0], [170, 0], [170, 40], 4),
  [170, 190],
  [0, 190],
];
const jacketFlap: Pt[] = [
  [0, 0],
  [180, 0],
  [180, 60],
  [0, 60],
];

// ---- Work shirt (cotton shirting) --------------------------------------------------------------
const shirtFront: Pt[] = [
  [0, 0],
  [280, 0],
  [275, 420],
  ...curve([275, 420], [215, 450], [215, 580]),
  [95, 600],
  ...curve([95, 600], [85, 520], [0, 515]),
];
const shirtBack: Pt[] = [
  [5, 0],
  [555, 0],
  [560, 420],
  ...curve([560, 420], [495, 450], [490, 560]),
  [70, 560],
  ...curve([70, 560], [65, 450], [0, 420]),
];
const shirtYoke: Pt[] = [
  [0, 0],
  [420, 0],
  [440, 120],
  [300, 140],
  [120, 140],
  [-20, 120],
];
const shirtCapTop: Pt = [165, 600];
const shirtSleeve: Pt[] = [
  [30, 0],
  [300, 0],
  [330, 480],
  ...curve([330, 480], [310, 600], shirtCapTop, 6),
  ...curve(shirtCapTop, [20, 600], [0, 480], 6),
];
const shirtCuff: Pt[] = [
  [0, 0],
  [250, 0],
  [250, 70],
  [0, 70],
];
const shirtBand: Pt[] = [[0, 0], ...curve([0, 0], [210, -12], [420, 0], 6), [415, 40], ...curve([415, 40], [210, 28], [5, 40], 6)];

// ---- Trousers (wool twill) ---------------------------------------------------------------------
const trousersFront: Pt[] = [
  [20, 0],
  [250, 0],
  [290, 760],
  [280, 1050],
  [40, 1060],
  [30, 880],
  ...curve([30, 880], [20, 790], [-60, 780], 5),
];
const trousersBack: Pt[] = [
  [40, 0],
  [300, 0],
  [400, 778],
  ...curve([400, 778], [320, 800], [310, 900], 5),
  [330, 1090],
  [10, 1050],
  [0, 760],
];
const waistband: Pt[] = [
  [0, 0],
  [575, 0],
  [575, 45],
  [0, 45],
];
const pocketBag: Pt[] = [
  [0, 0],
  [170, 0],
  [190, 260],
  [0, 300],
];

/** The demo panels, keyed for fixed ids. */
export const demoPanels: DemoPanel[] = [
  panel({
    key: "jacket:front",
    garment: "jacket",
    name: "Front",
    outline: jacketFront,
    grainline: [
      [150, 80],
      [150, 600],
    ],
    cutCount: 2,
    mirrored: true,
    notches: [{ point: [297.5, 235], edge: 1 }],
  }),
  panel({
    key: "jacket:back",
    garment: "jacket",
    name: "Back",
    outline: jacketBack,
    grainline: [
      [140, 80],
      [140, 620],
    ],
    cutCount: 2,
    mirrored: true,
    notches: [{ point: [287.5, 235], edge: 1 }],
  }),
  panel({
    key: "jacket:sleeve",
    garment: "jacket",
    name: "Sleeve",
    outline: jacketSleeve,
    grainline: [
      [165, 60],
      [165, 520],
    ],
    cutCount: 2,
    mirrored: true,
  }),
  panel({
    key: "jacket:collar",
    garment: "jacket",
    name: "Collar",
    outline: jacketCollar,
    grainline: [
      [80, 40],
      [380, 40],
    ],
    cutCount: 2,
    mirrored: false,
  }),
  panel({
    key: "jacket:pocket",
    garment: "jacket",
    name: "Patch pocket",
    outline: jacketPocket,
    grainline: [
      [85, 30],
      [85, 160],
    ],
    cutCount: 2,
    mirrored: false,
  }),
  panel({
    key: "jacket:flap",
    garment: "jacket",
    name: "Pocket flap",
    outline: jacketFlap,
    grainline: [
      [90, 10],
      [90, 50],
    ],
    cutCount: 4,
    mirrored: false,
  }),
  panel({
    key: "shirt:front",
    garment: "shirt",
    name: "Front",
    outline: shirtFront,
    grainline: [
      [140, 60],
      [140, 460],
    ],
    cutCount: 2,
    mirrored: true,
  }),
  panel({
    key: "shirt:back",
    garment: "shirt",
    name: "Back",
    outline: shirtBack,
    grainline: [
      [280, 60],
      [280, 480],
    ],
    cutCount: 1,
    mirrored: false,
  }),
  panel({
    key: "shirt:yoke",
    garment: "shirt",
    name: "Yoke",
    outline: shirtYoke,
    grainline: [
      [60, 70],
      [360, 70],
    ],
    cutCount: 2,
    mirrored: false,
  }),
  panel({
    key: "shirt:sleeve",
    garment: "shirt",
    name: "Sleeve",
    outline: shirtSleeve,
    grainline: [
      [165, 60],
      [165, 520],
    ],
    cutCount: 2,
    mirrored: true,
  }),
  panel({
    key: "shirt:cuff",
    garment: "shirt",
    name: "Cuff",
    outline: shirtCuff,
    grainline: [
      [20, 35],
      [230, 35],
    ],
    cutCount: 4,
    mirrored: false,
  }),
  panel({
    key: "shirt:band",
    garment: "shirt",
    name: "Collar band",
    outline: shirtBand,
    grainline: [
      [60, 20],
      [360, 20],
    ],
    cutCount: 2,
    mirrored: false,
  }),
  panel({
    key: "trousers:front",
    garment: "trousers",
    name: "Front",
    outline: trousersFront,
    grainline: [
      [150, 100],
      [150, 950],
    ],
    cutCount: 2,
    mirrored: true,
    seamAllowanceMm: 15,
  }),
  panel({
    key: "trousers:back",
    garment: "trousers",
    name: "Back",
    outline: trousersBack,
    grainline: [
      [170, 100],
      [170, 950],
    ],
    cutCount: 2,
    mirrored: true,
    seamAllowanceMm: 15,
  }),
  panel({
    key: "trousers:waistband",
    garment: "trousers",
    name: "Waistband",
    outline: waistband,
    grainline: [
      [40, 22],
      [540, 22],
    ],
    cutCount: 2,
    mirrored: false,
  }),
  panel({
    key: "trousers:pocket",
    garment: "trousers",
    name: "Pocket bag",
    outline: pocketBag,
    grainline: [
      [85, 30],
      [85, 250],
    ],
    cutCount: 4,
    mirrored: false,
    grainMode: "free",
  }),
];

const last = (o: Pt[]) => o.length - 1;

/** The demo seams: plain ones match within 3 mm, eased ones fall inside their ranges. */
export const demoSeams: DemoSeam[] = [
  {
    key: "jacket:side",
    name: "Jacket side seam",
    a: { panel: "jacket:front", from: 1, to: 2, direction: "forward" },
    b: { panel: "jacket:back", from: 1, to: 2, direction: "forward" },
    eased: null,
  },
  // The back shoulder is a few millimetres longer and eased in, as usual.
  {
    key: "jacket:shoulder",
    name: "Jacket shoulder",
    a: { panel: "jacket:back", from: at(jacketBack, jBackArm[jBackArm.length - 1]), to: at(jacketBack, [80, 760]), direction: "forward" },
    b: {
      panel: "jacket:front",
      from: at(jacketFront, jFrontArm[jFrontArm.length - 1]),
      to: at(jacketFront, [95, 750]),
      direction: "forward",
    },
    eased: { minMm: 0, maxMm: 8 },
  },
  {
    key: "jacket:sleeve-head-front",
    name: "Sleeve head (front)",
    a: { panel: "jacket:sleeve", from: 2, to: at(jacketSleeve, capTop), direction: "forward" },
    b: { panel: "jacket:front", from: 2, to: at(jacketFront, jFrontArm[jFrontArm.length - 1]), direction: "forward" },
    eased: { minMm: 5, maxMm: 25 },
  },
  {
    key: "jacket:sleeve-head-back",
    name: "Sleeve head (back)",
    a: { panel: "jacket:sleeve", from: at(jacketSleeve, capTop), to: last(jacketSleeve), direction: "forward" },
    b: { panel: "jacket:back", from: at(jacketBack, jBackArm[jBackArm.length - 1]), to: 2, direction: "backward" },
    eased: { minMm: 5, maxMm: 25 },
  },
  {
    key: "jacket:underarm",
    name: "Jacket sleeve underarm",
    a: { panel: "jacket:sleeve", from: 1, to: 2, direction: "forward" },
    b: { panel: "jacket:sleeve", from: 0, to: last(jacketSleeve), direction: "backward" },
    eased: null,
  },
  {
    key: "shirt:side",
    name: "Shirt side seam",
    a: { panel: "shirt:front", from: 1, to: 2, direction: "forward" },
    b: { panel: "shirt:back", from: 1, to: 2, direction: "forward" },
    eased: null,
  },
  {
    key: "shirt:yoke",
    name: "Yoke to back",
    a: { panel: "shirt:yoke", from: 0, to: 1, direction: "forward" },
    b: { panel: "shirt:back", from: at(shirtBack, [70, 560]), to: at(shirtBack, [490, 560]), direction: "backward" },
    eased: null,
  },
  {
    key: "shirt:underarm",
    name: "Shirt sleeve underarm",
    a: { panel: "shirt:sleeve", from: 1, to: 2, direction: "forward" },
    b: { panel: "shirt:sleeve", from: 0, to: last(shirtSleeve), direction: "backward" },
    eased: null,
  },
  // The sleeve is gathered into the cuff.
  {
    key: "shirt:cuff",
    name: "Sleeve into cuff",
    a: { panel: "shirt:sleeve", from: 0, to: 1, direction: "forward" },
    b: { panel: "shirt:cuff", from: 0, to: 1, direction: "forward" },
    eased: { minMm: 10, maxMm: 40 },
  },
  {
    key: "trousers:outseam",
    name: "Trouser side seam",
    a: { panel: "trousers:front", from: 1, to: 3, direction: "forward" },
    b: { panel: "trousers:back", from: 0, to: last(trousersBack) - 1, direction: "backward" },
    eased: null,
  },
  {
    key: "trousers:inseam",
    name: "Trouser inseam",
    a: { panel: "trousers:front", from: 0, to: last(trousersFront), direction: "backward" },
    b: { panel: "trousers:back", from: 1, to: 2, direction: "forward" },
    eased: null,
  },
];

export type { Point };
