import { describe, expect, it } from "vitest";
import { parseEnv } from "~/config/env-schema";

describe("configuration validation", () => {
  it("works with no settings at all (local defaults)", () => {
    const env = parseEnv({});
    expect(env.APP_URL).toBe("http://127.0.0.1:3000");
    expect(env.SMTP_PORT).toBe(1025);
    expect(env.OUTBOX_WORKER).toBe(true);
  });

  it("treats empty strings as unset", () => {
    expect(parseEnv({ SMTP_PORT: "" }).SMTP_PORT).toBe(1025);
  });

  it("rejects a bad config naming every bad variable, its value and how to fix it", () => {
    let message = "";
    try {
      parseEnv({ DATABASE_URL: "mysql://x", SMTP_PORT: "70000", AUTH_SECRET: "short" });
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toContain("configuration is invalid");
    expect(message).toMatch(/DATABASE_URL: must be a postgres:\/\/ connection URL \(got "mysql:\/\/x"\)/);
    expect(message).toMatch(/SMTP_PORT: .*\(got "70000"\)/);
    expect(message).toMatch(/AUTH_SECRET: must be at least 32 characters/);
    expect(message).toContain(".env.example");
  });

  it("reads boolean flags", () => {
    expect(parseEnv({ AUTH_RATE_LIMIT: "false" }).AUTH_RATE_LIMIT).toBe(false);
    expect(() => parseEnv({ AUTH_RATE_LIMIT: "maybe" })).toThrow(/AUTH_RATE_LIMIT/);
  });
});
