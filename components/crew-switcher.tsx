"use client";

import { useRef } from "react";
import { switchCrewAction } from "@/app/(app)/actions";

export interface CrewSwitcherProps {
  crews: { crewId: number; name: string; role: string }[];
  activeCrewId: number;
}

/** A plain select that submits on change; works with the keyboard and on phones. */
export function CrewSwitcher({ crews, activeCrewId }: CrewSwitcherProps) {
  const form = useRef<HTMLFormElement>(null);
  if (crews.length < 2) {
    const only = crews[0];
    return only ? <p className="truncate text-sm font-semibold">{only.name}</p> : null;
  }
  return (
    <form ref={form} action={switchCrewAction}>
      <label htmlFor="crew-switcher" className="sr-only">
        Crew
      </label>
      <select
        id="crew-switcher"
        name="crewId"
        defaultValue={activeCrewId}
        onChange={() => form.current?.requestSubmit()}
        className="min-h-11 w-full rounded-md border border-tide-500 bg-tide-900 px-2 text-sm font-semibold text-white"
      >
        {crews.map((c) => (
          <option key={c.crewId} value={c.crewId}>
            {c.name} ({c.role})
          </option>
        ))}
      </select>
      <noscript>
        <button type="submit">Switch</button>
      </noscript>
    </form>
  );
}
