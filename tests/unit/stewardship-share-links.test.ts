import { describe, expect, it } from "vitest";
import { MAX_LINK_DAYS, checkLinkExpiry, linkStateAt, looksLikeLinkToken, newLinkToken } from "@/lib/stewardship/shareLinks";
import { Refusal } from "@/lib/errors";

// The pure parts of share links: when a link is in force, which expiries are accepted,
// and the shape of the tokens we issue.

const now = new Date("2030-06-15T12:00:00Z");
const at = (iso: string) => new Date(iso);

describe("linkStateAt", () => {
  it("is in force with no expiry and no revocation", () => {
    expect(linkStateAt({ revokedAt: null, expiresAt: null }, now)).toBe("in force");
  });
  it("is in force up to, but not at, the expiry instant", () => {
    expect(linkStateAt({ revokedAt: null, expiresAt: at("2030-06-15T12:00:00.001Z") }, now)).toBe("in force");
    expect(linkStateAt({ revokedAt: null, expiresAt: at("2030-06-15T12:00:00Z") }, now)).toBe("expired");
    expect(linkStateAt({ revokedAt: null, expiresAt: at("2030-06-15T11:59:59Z") }, now)).toBe("expired");
  });
  it("is revoked as soon as revoked_at is set, whatever the expiry", () => {
    expect(linkStateAt({ revokedAt: at("2030-06-15T11:00:00Z"), expiresAt: null }, now)).toBe("revoked");
    expect(linkStateAt({ revokedAt: at("2030-06-15T11:00:00Z"), expiresAt: at("2031-01-01T00:00:00Z") }, now)).toBe("revoked");
    expect(linkStateAt({ revokedAt: at("2030-06-01T00:00:00Z"), expiresAt: at("2030-06-10T00:00:00Z") }, now)).toBe("revoked");
  });
});

describe("checkLinkExpiry", () => {
  it("accepts no expiry and a future one within the limit", () => {
    expect(checkLinkExpiry(null, now)).toBeNull();
    const inAWeek = at("2030-06-22T12:00:00Z");
    expect(checkLinkExpiry(inAWeek, now)).toEqual(inAWeek);
  });
  it("refuses a past or present moment, an invalid date and one beyond the limit, naming the field", () => {
    const cases = [
      at("2030-06-15T12:00:00Z"),
      at("2029-01-01T00:00:00Z"),
      new Date(Number.NaN),
      new Date(now.getTime() + (MAX_LINK_DAYS + 1) * 86_400_000),
    ];
    for (const c of cases) {
      let refusal: unknown;
      try {
        checkLinkExpiry(c, now);
      } catch (error) {
        refusal = error;
      }
      expect(refusal).toBeInstanceOf(Refusal);
      expect((refusal as Refusal).field).toBe("expiresAt");
      expect((refusal as Refusal).message).toMatch(/^expiresAt: /);
    }
  });
});

describe("tokens", () => {
  it("are 32 random bytes in base64url (43 characters), all different", () => {
    const tokens = Array.from({ length: 200 }, newLinkToken);
    for (const t of tokens) {
      expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
      expect(Buffer.from(t, "base64url").length).toBe(32);
      expect(looksLikeLinkToken(t)).toBe(true);
    }
    expect(new Set(tokens).size).toBe(tokens.length);
  });
  it("anything that is not base64url of a plausible length is not looked up", () => {
    for (const bad of ["", "short", "a".repeat(31), "a".repeat(129), `${"a".repeat(40)}/..`, `${"a".repeat(40)}%20`, `${"a".repeat(40)}=`])
      expect(looksLikeLinkToken(bad)).toBe(false);
  });
});
