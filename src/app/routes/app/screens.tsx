import { lazy, type ComponentType, type LazyExoticComponent } from "react";
import type { ScreenKey } from "@shared/permissions";

/**
 * Which page renders each screen of the app. A screen not listed here shows an honest
 * "not built yet" page. Each feature adds its own line.
 */
export const screenComponents: Partial<Record<ScreenKey, LazyExoticComponent<ComponentType>>> = {
  today: lazy(() => import("./today")),
  team: lazy(() => import("./team")),
};
