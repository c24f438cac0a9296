"use client";

import { useEffect, useState } from "react";
import { FALLBACK_THEME, readDocumentTheme, themesEqual, type ChartTheme } from "./chart-theme";

/**
 * The chart theme from CSS custom properties, read at mount and again whenever the root
 * element's `data-field-mode` attribute changes (the high-contrast field mode swaps the variables).
 */
export function useChartTheme(): ChartTheme {
  const [theme, setTheme] = useState<ChartTheme>(FALLBACK_THEME);

  useEffect(() => {
    const update = () => {
      const next = readDocumentTheme();
      setTheme((prev) => (themesEqual(prev, next) ? prev : next));
    };
    update();
    const mo = new MutationObserver(update);
    mo.observe(document.documentElement, { attributes: true, attributeFilter: ["data-field-mode"] });
    return () => mo.disconnect();
  }, []);

  return theme;
}
