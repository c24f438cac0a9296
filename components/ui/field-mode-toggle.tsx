"use client";

import { useEffect, useState } from "react";
import { FIELD_MODE_COOKIE } from "./field-mode";

/** Switches the high-contrast field mode for a phone in sunlight; remembered for a year. */
export function FieldModeToggle() {
  const [on, setOn] = useState(false);
  useEffect(() => setOn(document.documentElement.dataset.fieldMode === "on"), []);
  const toggle = () => {
    const next = !on;
    setOn(next);
    if (next) document.documentElement.dataset.fieldMode = "on";
    else delete document.documentElement.dataset.fieldMode;
    // Set by script, so it cannot be HttpOnly; it holds only a display preference (ASVS V3.4.1–3.4.3:
    // Secure over https, SameSite=Lax).
    const secure = location.protocol === "https:" ? "; secure" : "";
    document.cookie = `${FIELD_MODE_COOKIE}=${next ? "on" : ""}; path=/; max-age=${next ? 31_536_000 : 0}; samesite=lax${secure}`;
  };
  return (
    <button type="button" className="btn-quiet" aria-pressed={on} onClick={toggle} data-testid="field-mode">
      <svg viewBox="0 0 24 24" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth="2" aria-hidden="true">
        <circle cx="12" cy="12" r="4" />
        <path d="M12 2v2M12 20v2M2 12h2M20 12h2M4.9 4.9l1.4 1.4M17.7 17.7l1.4 1.4M4.9 19.1l1.4-1.4M17.7 6.3l1.4-1.4" strokeLinecap="round" />
      </svg>
      {on ? "Field mode on" : "Field mode"}
    </button>
  );
}
