import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { KNOWN_AUTH_SECRETS, parseEnv } from "~/config/env-schema";

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

describe("the signing secret in production", () => {
  const strong = "a3f1c9e07b5d42e8a61f0c3b9d7e5a2f4c8b6d0e1a9f3c7b5d2e8a4f6c0b1d3e";

  it("refuses the public development default, naming the variable and not printing the secret", () => {
    let message = "";
    try {
      parseEnv({ NODE_ENV: "production" });
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(/AUTH_SECRET: is the public development default/);
    expect(message).not.toContain(KNOWN_AUTH_SECRETS[0]);
  });

  it("refuses the example value copied from .env.example", () => {
    // The example file is what people copy; its value is public too.
    const example = readFileSync(".env.example", "utf8").match(/^AUTH_SECRET=(.*)$/m)?.[1];
    expect(example).toBeTruthy();
    expect(() => parseEnv({ NODE_ENV: "production", AUTH_SECRET: example })).toThrow(/AUTH_SECRET/);
  });

  it("refuses a short secret (common practice: at least 256 bits, 32 characters)", () => {
    expect(() => parseEnv({ NODE_ENV: "production", AUTH_SECRET: "x".repeat(31) })).toThrow(/at least 32 characters/);
  });

  it("accepts a long random secret, and the default outside production", () => {
    expect(parseEnv({ NODE_ENV: "production", AUTH_SECRET: strong }).AUTH_SECRET).toBe(strong);
    expect(parseEnv({ NODE_ENV: "test" }).AUTH_SECRET).toBe(KNOWN_AUTH_SECRETS[0]);
  });
});
