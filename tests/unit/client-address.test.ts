import { describe, expect, it } from "vitest";
// @ts-expect-error -- a plain ESM script shared with scripts/serve.mjs, without type declarations
import { clientAddress, trustedProxies } from "../../scripts/client-address.mjs";

// X-Forwarded-For semantics as in MDN's "X-Forwarded-For" page and RFC 7239 §5.2: each proxy
// appends the address it received the request from, so only entries added by proxies we
// trust are worth anything, read from the right.
describe("clientAddress", () => {
  const none = trustedProxies(undefined);
  const lb = trustedProxies("10.0.0.0/8, 127.0.0.1");

  it("uses the socket address and ignores X-Forwarded-For when no proxy is trusted", () => {
    expect(clientAddress("127.0.0.1", "203.0.113.9", none)).toBe("127.0.0.1");
    expect(clientAddress("::ffff:198.51.100.4", "1.2.3.4, 5.6.7.8", none)).toBe("198.51.100.4");
  });

  it("a rotated X-Forwarded-For from a direct client changes nothing", () => {
    const seen = new Set(Array.from({ length: 50 }, (_, i) => clientAddress("198.51.100.4", `203.0.113.${i}`, lb)));
    expect([...seen]).toEqual(["198.51.100.4"]);
  });

  it("reads X-Forwarded-For from the right when the peer is a trusted proxy", () => {
    // The client put a forged entry first; the trusted balancer appended the real address.
    expect(clientAddress("10.1.2.3", "6.6.6.6, 198.51.100.77", lb)).toBe("198.51.100.77");
    // Two trusted hops.
    expect(clientAddress("127.0.0.1", "198.51.100.77, 10.9.9.9", lb)).toBe("198.51.100.77");
    // A trusted proxy with no header: the proxy itself.
    expect(clientAddress("10.1.2.3", undefined, lb)).toBe("10.1.2.3");
    // A malformed entry stops the walk at the last vouched address.
    expect(clientAddress("10.1.2.3", "198.51.100.77, not-an-ip", lb)).toBe("10.1.2.3");
  });

  it("refuses a malformed TRUSTED_PROXIES with the variable's name", () => {
    expect(() => trustedProxies("10.0.0.0/99")).toThrow(/TRUSTED_PROXIES/);
    expect(() => trustedProxies("proxy.internal")).toThrow(/TRUSTED_PROXIES/);
  });
});
