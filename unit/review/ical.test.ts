import ICAL from "ical.js";
import { describe, expect, it } from "vitest";
import { calendarAttachment, reviewDueCalendar } from "~/review/ical";

// Parsed with ical.js (an independent RFC 5545 implementation), not with our generator.
describe("review due-date calendar", () => {
  const dueAt = new Date("2027-02-14T17:00:00Z");
  const ics = reviewDueCalendar({ uid: "inv-42", title: "A thin stable layer", dueAt, url: "http://127.0.0.1:3000/invitations/abc", venueName: "Annals" });

  it("parses as one VEVENT whose start is the due date", () => {
    const cal = new ICAL.Component(ICAL.parse(ics));
    const events = cal.getAllSubcomponents("vevent");
    expect(events).toHaveLength(1);
    const event = new ICAL.Event(events[0]!);
    expect(event.startDate.toJSDate().toISOString()).toBe(dueAt.toISOString());
    expect(event.summary).toContain("A thin stable layer");
    expect(event.uid).toBe("inv-42@runproof");
    expect(cal.getFirstPropertyValue("version")).toBe("2.0");
  });

  it("round-trips through the mail attachment's base64", () => {
    const att = calendarAttachment(ics);
    expect(att.contentType).toMatch(/^text\/calendar/);
    const back = Buffer.from(att.contentBase64, "base64").toString("utf8");
    const event = new ICAL.Event(new ICAL.Component(ICAL.parse(back)).getFirstSubcomponent("vevent")!);
    expect(event.startDate.toJSDate().getTime()).toBe(dueAt.getTime());
  });
});
