import { describe, expect, it } from "vitest";
import { safeReturnPath } from "@/lib/auth/returnPath";

// Shapes of open-redirect payloads as listed by OWASP's "Unvalidated Redirects and Forwards
// Cheat Sheet" and the WHATWG URL standard's parsing rules (backslash is a path separator
// for special schemes; tab, CR and LF are stripped before parsing).
describe("safeReturnPath", () => {
  it.each([
    "/spectra",
    "/spectra/0b9c6a4e-3f2b-4c8e-9d55-1f0e2b3c4d5e?tab=runs#peaks",
    "/review?state=pending&sort=-created",
    "/series/abc%20def",
  ])("keeps the same-origin path %s", (path) => {
    expect(safeReturnPath(path)).toBe(path);
  });

  it.each([
    ["backslash after slash", "/\\evil.example/"],
    ["two backslashes", "\\\\evil.example"],
    ["slash backslash mixed", "/\\/evil.example"],
    ["tab between slashes", "/\t/evil.example"],
    ["encoded tab", "/%09/evil.example"],
    ["encoded newline", "/%0a/evil.example"],
    ["encoded slash", "/%2F/evil.example"],
    ["encoded slash lower case", "/%2f%2fevil.example"],
    ["encoded backslash", "/%5Cevil.example"],
    ["double slash", "//evil.example"],
    ["scheme-relative with path", "//evil.example/signin"],
    ["absolute URL", "https://evil.example/"],
    ["javascript scheme", "javascript:alert(1)"],
    ["javascript after slash-less", "javascript://%0aalert(1)"],
    ["data scheme", "data:text/html,<script>alert(1)</script>"],
    ["relative without slash", "evil.example"],
    ["empty", ""],
    ["bidi override", "/\u202e/evil"],
    ["newline", "/\n/evil.example"],
  ])("refuses %s", (_name, path) => {
    expect(safeReturnPath(path)).toBe("/");
  });

  it("takes the first of repeated query values and refuses non-strings", () => {
    expect(safeReturnPath(["/samples", "//evil.example"])).toBe("/samples");
    expect(safeReturnPath(undefined)).toBe("/");
    expect(safeReturnPath(42)).toBe("/");
  });
});
