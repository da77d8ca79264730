import ical, { ICalAlarmType, ICalCalendarMethod } from "ical-generator";

/**
 * The due date of a review as an RFC 5545 calendar (one all-day-free, timed event at the due
 * moment, with a reminder a day before), attached to the invitation mail.
 */
export function reviewDueCalendar(opts: { uid: string; title: string; dueAt: Date; url: string; venueName: string }) {
  const cal = ical({ prodId: { company: "Runproof", product: "review-due", language: "EN" }, method: ICalCalendarMethod.PUBLISH });
  const end = new Date(opts.dueAt.getTime() + 30 * 60_000);
  const event = cal.createEvent({
    id: `${opts.uid}@runproof`,
    start: opts.dueAt,
    end,
    summary: `Review due: ${opts.title}`,
    description: `Your review for ${opts.venueName} is due. Open the review: ${opts.url}`,
    url: opts.url,
    stamp: new Date(),
  });
  event.createAlarm({ type: ICalAlarmType.display, trigger: 24 * 3600, description: "Review due tomorrow" });
  return cal.toString();
}

export function calendarAttachment(ics: string) {
  return { filename: "review-due.ics", contentType: "text/calendar; charset=utf-8; method=PUBLISH", contentBase64: Buffer.from(ics, "utf8").toString("base64") };
}
