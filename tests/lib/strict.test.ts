/** The unknown-field message of strict request objects (lib/validation/strict.ts). Names are invented for the test. */
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldErrors, validationError } from "@/lib/http";
import { nearestName, strictObject, unknownFieldsMessage } from "@/lib/validation/strict";

describe("unknown fields", () => {
  it("suggests the known name a slip came from, and nothing for a stranger", () => {
    expect(nearestName("nmae", ["name", "notes"])).toBe("name");
    expect(nearestName("lockversion", ["lockVersion"])).toBe("lockVersion");
    expect(nearestName("citatoin", ["citation", "data"])).toBe("citation");
    expect(nearestName("colour", ["name", "notes"])).toBeNull();
    expect(unknownFieldsMessage(["nmae", "colour"], ["name"])).toBe('Unknown fields "nmae" (did you mean "name"?), "colour".');
  });

  it("a strict object refuses the field at its own path, also nested and in derived schemas", () => {
    const inner = strictObject({ citation: z.string() });
    const schema = strictObject({ name: z.string(), version: inner });
    const e = schema.safeParse({ name: "a", version: { citation: "b", citatoin: "c" } }).error!;
    expect(fieldErrors(e)).toEqual({ "version.citatoin": 'Unknown field "citatoin" (did you mean "citation"?).' });
    expect(validationError(e).message).toBe('version: Unknown field "citatoin" (did you mean "citation"?).');
    const derived = schema.partial().extend({ lockVersion: z.number() });
    expect(validationError(derived.safeParse({ lockVerison: 1, lockVersion: 1 }).error!).message).toBe('Unknown field "lockVerison" (did you mean "lockVersion"?).');
  });
});
