/**
 * The demo fabric library with the test readings a workroom would take (specimens 100 × 100 mm;
 * strips 50 × 200 mm). Pure data, so tests can re-test the demo fabrics without a database.
 * Suppliers are invented.
 */

export interface FabricSeed {
  key: string;
  name: string;
  supplier: string;
  fibres: Array<[string, number]>;
  construction: "woven" | "knit";
  widthMm: number;
  gsm: number;
  thicknessMm: number;
  stretch?: [number, number];
  colour: string;
  care: string;
  /** Overhang at 41.5°, warp and weft (mm). */
  overhang: [number, number];
  /** Load (N) at 4 mm extension on a 50 × 200 mm strip, warp and weft. */
  stripLoad?: [number, number];
}

/** The demo fabric library. */
export const fabricSeeds: FabricSeed[] = [
  {
    key: "wool-suiting",
    name: "Grey wool suiting",
    supplier: "Kestrel Mill Cloths",
    fibres: [["wool", 100]],
    construction: "woven",
    widthMm: 1500,
    gsm: 280,
    thicknessMm: 0.55,
    colour: "storm grey",
    care: "Dry clean. Steam press through a cloth.",
    overhang: [52, 48],
    stripLoad: [21, 17],
  },
  {
    key: "oilskin",
    name: "Oilskin cotton",
    supplier: "Tamarisk Textiles",
    fibres: [["cotton", 100]],
    construction: "woven",
    widthMm: 1480,
    gsm: 340,
    thicknessMm: 0.62,
    colour: "mustard",
    care: "Do not wash or dry clean; sponge with cold water. Re-wax in a ventilated room away from heat.",
    overhang: [74, 70],
    stripLoad: [36, 30],
  },
  {
    key: "linen",
    name: "Mid-weight linen",
    supplier: "Bramblecote Weavers",
    fibres: [["linen", 100]],
    construction: "woven",
    widthMm: 1400,
    gsm: 190,
    thicknessMm: 0.38,
    colour: "natural",
    care: "Wash at 40 °C; iron damp on high.",
    overhang: [46, 42],
    stripLoad: [25, 20],
  },
  {
    key: "calico",
    name: "Unbleached calico",
    supplier: "Bramblecote Weavers",
    fibres: [["cotton", 100]],
    construction: "woven",
    widthMm: 1500,
    gsm: 135,
    thicknessMm: 0.3,
    colour: "unbleached",
    care: "Wash at 60 °C; shrinks about 3 % on first wash.",
    overhang: [38, 34],
    stripLoad: [16, 12],
  },
  {
    key: "jersey",
    name: "Cotton knit jersey",
    supplier: "Loom & Lantern Knits",
    fibres: [
      ["cotton", 95],
      ["elastane", 5],
    ],
    construction: "knit",
    widthMm: 1600,
    gsm: 200,
    thicknessMm: 0.7,
    stretch: [30, 60],
    colour: "oatmeal",
    care: "Wash at 30 °C inside out; dry flat.",
    overhang: [30, 24],
    stripLoad: [0.2, 0.1],
  },
  {
    key: "gansey",
    name: "Worsted gansey knit",
    supplier: "Loom & Lantern Knits",
    fibres: [["wool", 100]],
    construction: "knit",
    widthMm: 1400,
    gsm: 420,
    thicknessMm: 2.1,
    stretch: [15, 35],
    colour: "navy",
    care: "Hand wash cold; dry flat; never tumble.",
    overhang: [44, 36],
    stripLoad: [0.6, 0.3],
  },
  {
    key: "lawn",
    name: "Cotton lawn",
    supplier: "Tamarisk Textiles",
    fibres: [["cotton", 100]],
    construction: "woven",
    widthMm: 1450,
    gsm: 75,
    thicknessMm: 0.12,
    colour: "white",
    care: "Wash at 40 °C; starch for period collars.",
    overhang: [28, 26],
    stripLoad: [9, 7],
  },
  {
    key: "flannel",
    name: "Wool flannel",
    supplier: "Kestrel Mill Cloths",
    fibres: [
      ["wool", 85],
      ["nylon", 15],
    ],
    construction: "woven",
    widthMm: 1500,
    gsm: 250,
    thicknessMm: 0.9,
    colour: "charcoal",
    care: "Dry clean.",
    overhang: [44, 42],
    stripLoad: [13, 11],
  },
  {
    key: "moleskin",
    name: "Cotton moleskin",
    supplier: "Harrier & Finch",
    fibres: [["cotton", 100]],
    construction: "woven",
    widthMm: 1450,
    gsm: 380,
    thicknessMm: 0.85,
    colour: "olive brown",
    care: "Wash at 40 °C; press on the back.",
    overhang: [66, 58],
    stripLoad: [30, 22],
  },
  {
    key: "taffeta",
    name: "Silk taffeta",
    supplier: "Harrier & Finch",
    fibres: [["silk", 100]],
    construction: "woven",
    widthMm: 1400,
    gsm: 90,
    thicknessMm: 0.15,
    colour: "slate blue",
    care: "Dry clean only; water marks.",
    overhang: [40, 36],
    stripLoad: [14, 10],
  },
  {
    key: "melton",
    name: "Wool melton",
    supplier: "Kestrel Mill Cloths",
    fibres: [
      ["wool", 90],
      ["cashmere", 10],
    ],
    construction: "woven",
    widthMm: 1500,
    gsm: 520,
    thicknessMm: 1.8,
    colour: "black",
    care: "Dry clean; brush with the nap.",
    overhang: [88, 84],
    stripLoad: [48, 40],
  },
  {
    key: "drill",
    name: "Cotton drill",
    supplier: "Tamarisk Textiles",
    fibres: [["cotton", 100]],
    construction: "woven",
    widthMm: 1500,
    gsm: 260,
    thicknessMm: 0.5,
    colour: "navy",
    care: "Wash at 60 °C.",
    overhang: [56, 50],
    stripLoad: [28, 22],
  },
  {
    key: "crepe",
    name: "Black wool crepe",
    supplier: "Kestrel Mill Cloths",
    fibres: [
      ["wool", 70],
      ["silk", 30],
    ],
    construction: "woven",
    widthMm: 1400,
    gsm: 230,
    thicknessMm: 0.45,
    colour: "black",
    care: "Dry clean; low iron through a cloth.",
    overhang: [36, 34],
    stripLoad: [11, 9],
  },
];
