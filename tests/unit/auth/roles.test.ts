import { describe, expect, it } from "vitest";
import { roles } from "@/db/schema/crews";
import { can, permissions, roleAtLeast, roleChangeProblem } from "@/lib/auth/roles";

describe("roleAtLeast", () => {
  it("orders lead above pilot above observer", () => {
    expect(roleAtLeast("lead", "pilot")).toBe(true);
    expect(roleAtLeast("pilot", "observer")).toBe(true);
    expect(roleAtLeast("observer", "pilot")).toBe(false);
    expect(roleAtLeast("pilot", "lead")).toBe(false);
  });

  it("grants every role its own level", () => {
    for (const r of roles) expect(roleAtLeast(r, r)).toBe(true);
  });

  it("denies when there is no membership", () => {
    expect(roleAtLeast(null, "observer")).toBe(false);
    expect(roleAtLeast(undefined, "observer")).toBe(false);
  });
});

describe("can", () => {
  it("lets observers read and nothing else", () => {
    const allowed = (Object.keys(permissions) as (keyof typeof permissions)[]).filter((p) => can("observer", p));
    expect(allowed).toEqual(["read"]);
  });

  it("lets pilots upload and annotate but not manage the crew", () => {
    expect(can("pilot", "uploadLog")).toBe(true);
    expect(can("pilot", "writeNote")).toBe(true);
    expect(can("pilot", "manageRoutePlans")).toBe(true);
    expect(can("pilot", "manageMembers")).toBe(false);
    expect(can("pilot", "manageBuilds")).toBe(false);
    expect(can("pilot", "signOff")).toBe(false);
    expect(can("pilot", "delete")).toBe(false);
  });

  it("lets leads do everything", () => {
    for (const p of Object.keys(permissions) as (keyof typeof permissions)[]) expect(can("lead", p)).toBe(true);
  });
});

describe("roleChangeProblem", () => {
  it("refuses anyone but a lead", () => {
    expect(roleChangeProblem({ actorRole: "pilot", targetCurrentRole: "observer", newRole: "pilot", leadCount: 1 })).toMatch(/Only a lead/);
  });

  it("keeps at least one lead in the crew", () => {
    expect(roleChangeProblem({ actorRole: "lead", targetCurrentRole: "lead", newRole: "pilot", leadCount: 1 })).toMatch(/at least one lead/);
    expect(roleChangeProblem({ actorRole: "lead", targetCurrentRole: "lead", newRole: null, leadCount: 1 })).toMatch(/at least one lead/);
  });

  it("allows demoting a lead when another lead remains", () => {
    expect(roleChangeProblem({ actorRole: "lead", targetCurrentRole: "lead", newRole: "observer", leadCount: 2 })).toBeNull();
  });

  it("allows promoting and removing non-leads", () => {
    expect(roleChangeProblem({ actorRole: "lead", targetCurrentRole: "observer", newRole: "lead", leadCount: 1 })).toBeNull();
    expect(roleChangeProblem({ actorRole: "lead", targetCurrentRole: "pilot", newRole: null, leadCount: 1 })).toBeNull();
  });
});
