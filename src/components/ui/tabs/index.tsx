import type { KeyboardEvent } from "react";

/**
 * Arrow keys for a `role="tablist"`: Left/Right (and Up/Down) move to the neighbouring tab, Home/End to the
 * first and last, and open it, as the WAI-ARIA tabs pattern describes. Put it on the tab list's onKeyDown.
 */
export function onTabListKeyDown(e: KeyboardEvent<HTMLElement>): void {
  const tabs = [...e.currentTarget.querySelectorAll<HTMLElement>('[role="tab"]:not([disabled])')];
  const at = tabs.findIndex((t) => t === document.activeElement);
  if (at < 0 || tabs.length === 0) return;
  const next =
    e.key === "ArrowRight" || e.key === "ArrowDown"
      ? (at + 1) % tabs.length
      : e.key === "ArrowLeft" || e.key === "ArrowUp"
        ? (at - 1 + tabs.length) % tabs.length
        : e.key === "Home"
          ? 0
          : e.key === "End"
            ? tabs.length - 1
            : -1;
  if (next < 0) return;
  e.preventDefault();
  tabs[next]!.focus();
  tabs[next]!.click();
}
