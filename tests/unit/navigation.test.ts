import { describe, expect, it } from "vitest";
import type { Actor } from "@/lib/auth/actor";
import { navFor } from "@/lib/navigation";
import type { Role } from "@/models/Membership";

const actorWith = (...roles: Role[]): Actor => ({
  id: "u",
  email: "u@example.test",
  name: "U",
  isSiteAdmin: false,
  via: "session",
  memberships: roles.map((role, i) => ({ groupId: `g${i}`, groupName: `G${i}`, groupSlug: `g${i}`, role })),
});

describe("navigation by role", () => {
  it("gives review to leads only and stewardship to stewards only", () => {
    expect(navFor(actorWith("lead")).map((i) => i.label)).toContain("Review");
    expect(navFor(actorWith("spectroscopist")).map((i) => i.label)).not.toContain("Review");
    expect(navFor(actorWith("steward")).map((i) => i.label)).toContain("Data care");
    expect(navFor(actorWith("lead")).map((i) => i.label)).not.toContain("Data care");
  });

  it("gives a collaborator no upload, samples or spectra", () => {
    expect(navFor(actorWith("collaborator")).map((i) => i.label)).toEqual(["Overview", "Series", "Settings"]);
  });

  it("joins the entries of every group a person belongs to", () => {
    const labels = navFor(actorWith("collaborator", "steward")).map((i) => i.label);
    expect(labels).toContain("Data care");
    expect(labels).toContain("Spectra");
  });

  it("shows nothing to someone with no membership", () => {
    expect(navFor(actorWith())).toEqual([]);
  });
});
