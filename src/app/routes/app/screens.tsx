import { lazy, type ComponentType, type LazyExoticComponent } from "react";
import type { ScreenKey } from "@shared/permissions";

/**
 * Which page renders each screen of the app. A screen not listed here shows an honest
 * "not built yet" page. Each feature adds its own line. A screen's page may use nested
 * <Routes> for its own sub-pages.
 */
export const screenComponents: Partial<Record<ScreenKey, LazyExoticComponent<ComponentType>>> = {
  today: lazy(() => import("./today")),
  team: lazy(() => import("./team")),
  breakdown: lazy(() => import("./breakdown")),
  cast: lazy(() => import("./cast")),
  changes: lazy(() => import("./changes")),
  continuity: lazy(() => import("./continuity")),
  wardrobe: lazy(() => import("./wardrobe")),
  fabrics: lazy(() => import("./fabrics")),
  workroom: lazy(() => import("./workroom")),
  snags: lazy(() => import("./snags")),
  doubles: lazy(() => import("./doubles")),
  reports: lazy(() => import("./reports")),
};

/**
 * Sub-pages one feature adds under another feature's screen (e.g. measurements under Cast),
 * matched before the screen's own page. Paths are relative to /p/:productionId/:screen/.
 */
export const screenSubpages: Partial<Record<ScreenKey, Array<{ path: string; component: LazyExoticComponent<ComponentType> }>>> = {
  // Wardrobe feature: a performer's measurements and their printable sheet.
  cast: [
    { path: "performers/:performerId/measurements", component: lazy(() => import("./performer-measurements")) },
    { path: "performers/:performerId/measurements/print", component: lazy(() => import("./performer-measurement-sheet")) },
  ],
};
