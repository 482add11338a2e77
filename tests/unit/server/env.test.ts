import { describe, expect, it } from "vitest";
import { parseEnv } from "../../../server/env";

describe("parseEnv", () => {
  it("fills the documented defaults", () => {
    const e = parseEnv({ DATABASE_URL: "postgres://u:p@127.0.0.1:5432/d" });
    expect(e).toMatchObject({
      PORT: 3000,
      HOST: "127.0.0.1",
      NODE_ENV: "development",
      CLIENT_DIST: "dist/client",
      LOG_LEVEL: "info",
    });
    expect(e.TAPWRIGHT_VERSION).toMatch(/^\d+\.\d+\.\d+/);
  });

  it("requires DATABASE_URL, and SESSION_SECRET in production", () => {
    expect(() => parseEnv({})).toThrow(/DATABASE_URL/);
    expect(() => parseEnv({ DATABASE_URL: "postgres://x", NODE_ENV: "production" })).toThrow(
      /SESSION_SECRET/,
    );
    expect(
      parseEnv({
        DATABASE_URL: "postgres://x",
        NODE_ENV: "production",
        SESSION_SECRET: "s".repeat(32),
        MAIL_SINK: "on",
      }).NODE_ENV,
    ).toBe("production");
  });

  it("links mail to this server's own port unless PUBLIC_URL says otherwise", () => {
    expect(parseEnv({ DATABASE_URL: "postgres://x" }).PUBLIC_URL).toBe("http://127.0.0.1:3000");
    expect(parseEnv({ DATABASE_URL: "postgres://x", PORT: "3101" }).PUBLIC_URL).toBe("http://127.0.0.1:3101");
    expect(parseEnv({ DATABASE_URL: "postgres://x", PORT: "8080", HOST: "0.0.0.0" }).PUBLIC_URL).toBe(
      "http://127.0.0.1:8080",
    );
    expect(
      parseEnv({ DATABASE_URL: "postgres://x", PORT: "3101", PUBLIC_URL: "https://tapwright.example" })
        .PUBLIC_URL,
    ).toBe("https://tapwright.example");
  });

  it("coerces and checks the port", () => {
    expect(parseEnv({ DATABASE_URL: "postgres://x", PORT: "3101" }).PORT).toBe(3101);
    expect(() => parseEnv({ DATABASE_URL: "postgres://x", PORT: "70000" })).toThrow(/PORT/);
  });
});
