import { describe, expect, it } from "vitest";
import { z } from "zod";
import { validationError } from "@/server/http/errors";

const schema = z.strictObject({
  name: z.string().min(1, { error: "Type your full name to approve." }),
  terms: z.literal(true, { error: "Tick that you accept the terms." }),
  reason: z.string().min(3, { error: "Say why." }),
});

describe("a refusal's one-line message", () => {
  it("leads with the first field's own words and counts the rest in a sentence of its own", () => {
    const one = validationError(schema.safeParse({ name: "", terms: true, reason: "Because" }).error!);
    expect(one.message).toBe("Type your full name to approve.");
    const two = validationError(schema.safeParse({ name: "", terms: false, reason: "Because" }).error!);
    expect(two.message).toBe("Type your full name to approve. 1 more field needs fixing too.");
    const three = validationError(schema.safeParse({ name: "", terms: false, reason: "" }).error!);
    expect(three.message).toBe("Type your full name to approve. 2 more fields need fixing too.");
  });
});
