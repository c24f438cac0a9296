import { describe, expect, it } from "vitest";
import { passwordSchema, resetPasswordSchema, signUpSchema } from "@/lib/validations/auth";
import { buildCreateSchema } from "@/lib/validations/build";
import { routePlanCreateSchema } from "@/lib/validations/route-plan";

describe("signUpSchema", () => {
  it("normalises the e-mail to lower case and trims names", () => {
    const v = signUpSchema.parse({ name: "  Ada ", email: " Ada@Example.ORG ", password: "0123456789", crewName: " Harbour " });
    expect(v).toEqual({ name: "Ada", email: "ada@example.org", password: "0123456789", crewName: "Harbour" });
  });

  it("reports every bad field at once", () => {
    const r = signUpSchema.safeParse({ name: "", email: "nope", password: "short", crewName: "" });
    expect(r.success).toBe(false);
    const paths = new Set(r.error!.issues.map((i) => i.path.join(".")));
    expect(paths).toEqual(new Set(["name", "email", "password", "crewName"]));
  });
});

describe("passwordSchema", () => {
  // NIST SP 800-63B §5.1.1.2: length, not composition rules; bcrypt reads at most 72 bytes.
  it("accepts 10 to 72 characters of any kind", () => {
    expect(passwordSchema.safeParse("aaaaaaaaaa").success).toBe(true);
    expect(passwordSchema.safeParse("a".repeat(72)).success).toBe(true);
    expect(passwordSchema.safeParse("a".repeat(9)).success).toBe(false);
    expect(passwordSchema.safeParse("a".repeat(73)).success).toBe(false);
  });
});

describe("resetPasswordSchema", () => {
  it("flags a confirmation that differs", () => {
    const r = resetPasswordSchema.safeParse({ token: "t".repeat(43), password: "0123456789", confirm: "0123456780" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(["confirm"]);
  });
});

describe("routePlanCreateSchema", () => {
  const wp = (lat: number, lon: number) => ({ name: "w", lat, lon });
  it("needs two waypoints inside WGS84 ranges", () => {
    expect(routePlanCreateSchema.safeParse({ name: "r", waypoints: [wp(0, 0)] }).success).toBe(false);
    expect(routePlanCreateSchema.safeParse({ name: "r", waypoints: [wp(91, 0), wp(0, 0)] }).success).toBe(false);
    expect(routePlanCreateSchema.safeParse({ name: "r", waypoints: [wp(0, 181), wp(0, 0)] }).success).toBe(false);
    const ok = routePlanCreateSchema.parse({ name: "r", waypoints: [wp(-90, -180), wp(90, 180)] });
    expect(ok.vehicleClass).toBe("ground");
  });
});

describe("buildCreateSchema", () => {
  it("accepts a minimal build and refuses an unknown vehicle type", () => {
    expect(buildCreateSchema.safeParse({ name: "Rover", vehicleType: "ground" }).success).toBe(true);
    expect(buildCreateSchema.safeParse({ name: "Rover", vehicleType: "hovercraft" }).success).toBe(false);
  });

  it("keeps receiver sensitivity negative (dBm)", () => {
    expect(buildCreateSchema.safeParse({ name: "R", vehicleType: "boat", rxSensitivityDbm: 5 }).success).toBe(false);
    expect(buildCreateSchema.safeParse({ name: "R", vehicleType: "boat", rxSensitivityDbm: -110 }).success).toBe(true);
  });
});
