"use client";

import { useEffect, useState, type RefObject } from "react";

/** The element's content width in whole CSS pixels, kept current with a ResizeObserver (0 before mount). */
export function useElementWidth(ref: RefObject<HTMLElement | null>): number {
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const set = (w: number) => setWidth((prev) => (Math.floor(w) === prev ? prev : Math.floor(w)));
    set(el.getBoundingClientRect().width);
    if (typeof ResizeObserver === "undefined") return;
    const ro = new ResizeObserver((entries) => {
      for (const e of entries) set(e.contentRect.width);
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, [ref]);
  return width;
}
