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
  doubles: lazy(() => import("./doubles")),
};

/**
 * Sub-pages one feature adds under another feature's screen (e.g. measurements under Cast),
 * matched before the screen's own page. Paths are relative to /p/:productionId/:screen/.
 */
export const screenSubpages: Partial<Record<ScreenKey, Array<{ path: string; component: LazyExoticComponent<ComponentType> }>>> = {};
