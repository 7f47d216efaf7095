import { formatWhen } from "@/lib/format/dates";

// Sign-ins swamp a trail: a run of consecutive sign-ins (no other event between them, in the
// order shown) becomes one line per person, "Ada signed in 14 times between … and …", placed
// where that person's latest sign-in of the run was. Other events, and refused sign-ins, stay
// one line each. Pure.

export type FoldableEvent = { id: string; at: string; action: string; actorKey: string };

export type FoldedLine<E extends FoldableEvent> =
  { kind: "event"; event: E } | { kind: "sign-ins"; actorKey: string; count: number; first: string; last: string; events: E[] };

const isSignIn = (e: FoldableEvent) => e.action === "sign-in";

/** Events newest first in, lines newest first out. */
export function foldSignIns<E extends FoldableEvent>(events: readonly E[]): FoldedLine<E>[] {
  const out: FoldedLine<E>[] = [];
  let i = 0;
  while (i < events.length) {
    if (!isSignIn(events[i]!)) {
      out.push({ kind: "event", event: events[i]! });
      i++;
      continue;
    }
    let j = i;
    while (j < events.length && isSignIn(events[j]!)) j++;
    const byPerson = new Map<string, E[]>();
    for (const e of events.slice(i, j)) byPerson.set(e.actorKey, [...(byPerson.get(e.actorKey) ?? []), e]);
    // Map keeps first-seen order, which is each person's newest sign-in of the run
    for (const [actorKey, mine] of byPerson) {
      out.push(
        mine.length === 1
          ? { kind: "event", event: mine[0]! }
          : { kind: "sign-ins", actorKey, count: mine.length, first: mine[mine.length - 1]!.at, last: mine[0]!.at, events: mine },
      );
    }
    i = j;
  }
  return out;
}

/** "Ada Byron signed in 14 times between 2 Dec 2026, 09:00 UTC and 2 Dec 2026, 15:12 UTC" (or "at …" within one minute). */
export function foldedSentence(name: string, count: number, first: string, last: string): string {
  const [from, to] = [formatWhen(first), formatWhen(last)];
  return `${name} signed in ${count.toLocaleString("en-GB")} times ${from === to ? `at ${from}` : `between ${from} and ${to}`}`;
}
