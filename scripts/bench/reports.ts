// Benchmark: a continuity book of 60 scenes × 4 photos for one character (targets: ≤ 3 s, ≤ 15 MB),
// with the peak RSS increase while rendering. No database: photos are generated swatch images turned
// into the stored thumbnail and display sizes by the real photo pipeline, kept in a map as storage.
import { Writable } from "node:stream";
import { pathToFileURL } from "node:url";
import { makeVariants, renderSwatch } from "../../server/lib/images";
import { renderContinuityBook, type BookModel, type BookScene } from "../../server/lib/pdf/continuity-book-pdf";
import { PRINT_PHOTO_PX } from "../../server/services/reports-continuity.service";
import type { BookPhotoSize } from "../../shared/schemas/reports";

const SCENES = 60;
const PHOTOS_PER_SCENE = 4;
const VIEWS = ["front", "back", "left", "detail"] as const;
const TARGET_MS = 3000;
const TARGET_BYTES = 15 * 1024 * 1024;

/** Distinct generated photos (every one a different image, as on a real shoot), stored by key. */
async function benchPhotos(): Promise<Map<string, Buffer>> {
  const store = new Map<string, Buffer>();
  const hues = ["#2B3A67", "#B5452E", "#C98B2B", "#5B6770", "#3D6B4F", "#6B3D5E"];
  for (let i = 0; i < SCENES * PHOTOS_PER_SCENE; i++) {
    const img = await renderSwatch({
      width: 900,
      height: 1200,
      background: hues[i % hues.length]!,
      label: `Scene ${Math.floor(i / PHOTOS_PER_SCENE) + 1}`,
      sublabel: `${VIEWS[i % PHOTOS_PER_SCENE]} · photo ${i + 1}`,
    });
    const v = await makeVariants(img);
    store.set(`bench/${i}/thumb.webp`, v.files.thumb.body);
    store.set(`bench/${i}/display.webp`, v.files.display.body);
    store.set(`bench/${i}/print.jpg`, v.files.print.body);
  }
  return store;
}

function benchModel(size: BookPhotoSize): BookModel {
  const scenes: BookScene[] = Array.from({ length: SCENES }, (_, s) => ({
    number: String(s + 1),
    storyDay: Math.floor(s / 5) + 1,
    setName: "Harbour wall",
    intExt: "EXT",
    timeOfDay: "DAY",
    shootDays: [{ date: "2030-09-02", dayNumber: (s % 18) + 1, kind: "shoot" }],
    change: { number: (s % 6) + 1, description: "Work clothes" },
    distressStage: s % 3,
    loggedStage: s % 3,
    flags: { wet: s % 7 === 0, stunt: s % 11 === 0, blood: false, vfxShot: s % 13 === 0 },
    garments: [
      { tagCode: "BN-7K2Q", name: "Keeper's jacket", copyNumber: (s % 3) + 1, copiesHeld: 3 },
      { tagCode: "BN-4M8P", name: "Collarless work shirt", copyNumber: null, copiesHeld: null },
      { tagCode: "BN-9T3W", name: "Hobnail boots", copyNumber: null, copiesHeld: null },
    ],
    garmentsPlanned: false,
    notes: ["Logged 2030-09-02: Collar open, left cuff rolled twice."],
    // As the service picks them: thumbnails, or the stored print size when display size is asked for.
    photos: VIEWS.map((view, v) => ({
      id: `${s}-${v}`,
      view,
      caption: null,
      key: `bench/${s * PHOTOS_PER_SCENE + v}/${size === "display" ? "print.jpg" : "thumb.webp"}`,
    })),
  }));
  return {
    productionTitle: "Benchmark production",
    stage: false,
    characterName: "Bench Character",
    changeLabel: null,
    printedOn: "2030-09-01",
    paperSize: "A4",
    scenes,
  };
}

async function renderOnce(store: Map<string, Buffer>, size: BookPhotoSize) {
  let bytes = 0;
  const sink = new Writable({
    write(chunk: Buffer, _enc, cb) {
      bytes += chunk.length;
      cb();
    },
  });
  global.gc?.();
  const before = process.memoryUsage().rss;
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
  const t0 = performance.now();
  const r = await renderContinuityBook(benchModel(size), sink, {
    loadPhoto: async (key) => {
      const b = store.get(key);
      if (!b) throw new Error(`missing ${key}`);
      return b;
    },
    maxPhotoPx: PRINT_PHOTO_PX[size],
  });
  const ms = performance.now() - t0;
  clearInterval(sampler);
  peak = Math.max(peak, process.memoryUsage().rss);
  return { ms, bytes, pages: r.pages, images: r.imagesPerPage.reduce((a, b) => a + b, 0), rssIncrease: peak - before };
}

export async function runReportsBench(): Promise<void> {
  const store = await benchPhotos();
  const storeBytes = [...store.values()].reduce((s, b) => s + b.length, 0);
  console.log(
    `photos prepared: ${store.size / 3} × (thumbnail + display + print), ${(storeBytes / 1048576).toFixed(1)} MB held as "storage" (not counted below)`,
  );
  await renderOnce(store, "thumb"); // warm-up: fonts, sharp, JIT
  for (const size of ["thumb", "display"] as const) {
    const r = await renderOnce(store, size);
    const label = size === "display" ? "display size, from the stored print JPEG" : "thumbnails";
    const mb = r.bytes / 1048576;
    console.log(
      `continuity book, ${SCENES} scenes × ${PHOTOS_PER_SCENE} photos (${label}): ${r.ms.toFixed(0)} ms, ${mb.toFixed(2)} MB, ${r.pages} pages, ${r.images} images; ` +
        `peak RSS increase ${(r.rssIncrease / 1048576).toFixed(1)} MB; time ${(r.ms / TARGET_MS).toFixed(2)} × target (3 s), size ${(r.bytes / TARGET_BYTES).toFixed(2)} × target (15 MB)`,
    );
  }
}

if (import.meta.url === pathToFileURL(process.argv[1]!).href) await runReportsBench();
