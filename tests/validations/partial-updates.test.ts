import { describe, expect, it } from "vitest";
import { updateScannerSchema } from "@/lib/validations/scanner";
import { updateSiteSchema } from "@/lib/validations/site";

// A PATCH must change only what it sends: defaults of the create schemas must not leak into updates (common practice).
describe("update schemas leave omitted fields out", () => {
  it("updateScannerSchema.parse({ name }) yields only name", () => {
    expect(updateScannerSchema.parse({ name: "CT 9" })).toEqual({ name: "CT 9" });
  });
  it("updateSiteSchema.parse({ name }) yields only name", () => {
    expect(updateSiteSchema.parse({ name: "Site" })).toEqual({ name: "Site" });
  });
  it("updateScannerSchema still validates what is sent", () => {
    expect(() => updateScannerSchema.parse({ modality: "XX" })).toThrow(/Modality/);
  });
});
