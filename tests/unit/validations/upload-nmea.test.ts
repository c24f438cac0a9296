import { describe, expect, it } from "vitest";
import { uploadCreateSchema } from "@/lib/validations/upload";

const upload = (fileName: string, contentType: string) => uploadCreateSchema.safeParse({ fileName, size: 8011, contentType });

describe("uploadCreateSchema: NMEA captures", () => {
  it("accepts a .log capture under the type a Linux browser reports for it", () => {
    // freedesktop.org shared-mime-info maps *.log to text/x-log (globs2: "50:text/x-log:*.log").
    expect(upload("gp-320fw-2019-04-07-coldboot.log", "text/x-log").success).toBe(true);
    expect(upload("capture.nmea", "").success).toBe(true);
    expect(upload("capture.nmea", "text/x-nmea").success).toBe(true);
  });

  it("still refuses an image", () => {
    expect(upload("photo.log", "image/png").success).toBe(false);
  });
});
