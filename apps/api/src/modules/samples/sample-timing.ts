const DAY_MS = 86_400_000;

/**
 * Age and due date against the lab's turnaround target. The clock starts when the sample arrives;
 * before that it runs from the order, so a parcel lost in transit still shows up as late.
 */
export function sampleTiming(placedAt: Date, receivedAt: Date | null, turnaroundDays: number, now = new Date()) {
  const start = receivedAt ?? placedAt;
  const due = new Date(start.getTime() + turnaroundDays * DAY_MS);
  return {
    ageDays: Math.round(((now.getTime() - start.getTime()) / DAY_MS) * 10) / 10,
    dueAt: due.toISOString(),
    overdue: now.getTime() > due.getTime(),
  };
}
