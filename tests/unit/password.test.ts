import { describe, expect, it } from "vitest";
import { hashPassword, verifyPassword } from "@/lib/auth/password";

describe("verifyPassword", () => {
  it("accepts the password a hash was made from and refuses another", async () => {
    const stored = await hashPassword("cobalt-ridge");
    expect(await verifyPassword("cobalt-ridge", stored)).toBe(true);
    expect(await verifyPassword("cobalt-ridge!", stored)).toBe(false);
  });

  it("returns false, never throws, for a hash with scrypt parameters Node refuses", async () => {
    const [, , r, p, salt, key] = (await hashPassword("cobalt-ridge")).split("$");
    // N must be a power of two above 1; 2^30 with r = 8 needs 1 GiB, past the memory limit; a negative N is out of range.
    for (const n of ["3", String(2 ** 30), "-2"]) {
      await expect(verifyPassword("cobalt-ridge", ["scrypt", n, r, p, salt, key].join("$"))).resolves.toBe(false);
    }
    await expect(verifyPassword("cobalt-ridge", ["scrypt", "32768", r, String(2 ** 40), salt, key].join("$"))).resolves.toBe(false);
  });

  it("returns false for hashes of the wrong shape", async () => {
    for (const stored of ["", "bcrypt$1$2$3$4$5", "scrypt$x$8$1$c2FsdA==$a2V5", "scrypt$32768$8$1$c2FsdA==$c2hvcnQ="]) {
      expect(await verifyPassword("cobalt-ridge", stored)).toBe(false);
    }
  });
});
