import { describe, expect, it } from "vitest";
import { processSingleton, processSlot } from "@/lib/processSingleton";

// Known truth of the fixture: a value created once per name and process, shared by every caller.
describe("processSingleton", () => {
  it("creates the value once per name and hands every caller the same one", () => {
    let made = 0;
    const create = () => ({ n: ++made });
    const a = processSingleton("bandkeepTestSingleton", create);
    const b = processSingleton("bandkeepTestSingleton", create);
    expect(b).toBe(a);
    expect(made).toBe(1);
    expect(processSingleton("bandkeepTestOther", create)).not.toBe(a);
  });

  it("a slot is seen by another handle of the same name, and can be cleared", () => {
    const one = processSlot<number>("bandkeepTestSlot");
    const two = processSlot<number>("bandkeepTestSlot");
    expect(two.get()).toBeUndefined();
    one.set(7);
    expect(two.get()).toBe(7);
    two.set(undefined);
    expect(one.get()).toBeUndefined();
  });
});
