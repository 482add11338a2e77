import bcrypt from "bcryptjs";
import { describe, expect, it } from "vitest";
import {
  BCRYPT_COST,
  generateTemporaryPassword,
  hashPassword,
  verifyPassword,
} from "../../../server/auth/passwords";

describe("bcrypt (bcryptjs) against independent implementations", () => {
  // Test vectors of Openwall's crypt_blowfish (S. Designer, crypt_blowfish 1.3, wrapper.c test list), quoted from
  // memory and confirmed with glibc/libxcrypt crypt(3) on Debian 12 (Python's crypt module) before being written here.
  const OPENWALL: [string, string][] = [
    ["U*U", "$2a$05$CCCCCCCCCCCCCCCCCCCCC.E5YPO9kmyuRGyh0XouQYb4YMJKvyOeW"],
    ["U*U*", "$2a$05$CCCCCCCCCCCCCCCCCCCCC.VGOzA784oUp/Z0DY336zx7pLYAy0lwK"],
    ["", "$2a$05$CCCCCCCCCCCCCCCCCCCCC.7uG0VCzI2bS7j6ymqJi9CdcdxiRTWNy"],
  ];
  it.each(OPENWALL)("reproduces the crypt_blowfish vector for %j", (password, expected) => {
    expect(bcrypt.hashSync(password, expected.slice(0, 29))).toBe(expected);
  });

  it("matches libxcrypt at cost 12 (computed independently with crypt(3) on Debian 12)", () => {
    // python3 -c "import crypt; print(crypt.crypt('tapwright-admin', '$2b$12$abcdefghijklmnopqrstuu'))"
    const expected = "$2b$12$abcdefghijklmnopqrstuuk7NtuEkWqxCgUi/LTiEXSO/HIHnaRu.";
    expect(bcrypt.hashSync("tapwright-admin", "$2b$12$abcdefghijklmnopqrstuu")).toBe(expected);
  });
});

describe("hashPassword / verifyPassword", () => {
  it("hashes at cost 12 in the modular crypt format and verifies", async () => {
    expect(BCRYPT_COST).toBe(12);
    const hash = await hashPassword("coastwatch-secret");
    // "$2b$12$" + 22 salt + 31 hash characters (Provos and Mazières, "A Future-Adaptable Password Scheme", 1999).
    expect(hash).toMatch(/^\$2b\$12\$[./A-Za-z0-9]{53}$/);
    expect(await verifyPassword("coastwatch-secret", hash)).toBe(true);
    expect(await verifyPassword("coastwatch-secreT", hash)).toBe(false);
  });

  it("answers false for an unknown user (no hash) after a real compare", async () => {
    expect(await verifyPassword("anything", undefined)).toBe(false);
  });
});

describe("generateTemporaryPassword", () => {
  it("gives 16 characters from the unambiguous alphabet, different each time", () => {
    const seen = new Set<string>();
    for (let i = 0; i < 200; i += 1) {
      const p = generateTemporaryPassword();
      expect(p).toMatch(/^[a-km-zA-HJ-NP-Z2-9]{16}$/);
      seen.add(p);
    }
    expect(seen.size).toBe(200);
  });

  it("uses every character of the alphabet about equally often (chi-square, 57 bins)", () => {
    const counts = new Map<string, number>();
    const n = 2000;
    for (let i = 0; i < n; i += 1)
      for (const c of generateTemporaryPassword()) counts.set(c, (counts.get(c) ?? 0) + 1);
    expect(counts.size).toBe(57);
    const expected = (n * 16) / 57;
    const chi2 = [...counts.values()].reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    // 56 degrees of freedom: the 99.9th percentile of chi-square is 94.46, computed independently (bisection on the
    // regularized lower incomplete gamma series, Abramowitz and Stegun, Handbook of Mathematical Functions, 1964,
    // eq. 6.5.29, in Python). A modulo bias (256 % 57 = 28 favoured characters) would push it far above.
    expect(chi2).toBeLessThan(94.46);
  });
});
