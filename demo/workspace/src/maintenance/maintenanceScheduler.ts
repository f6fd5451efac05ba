// Planned maintenance scheduler. Each task has an interval in running hours, calendar days, or
// both ("whichever comes first"). The scheduler forecasts due dates from the running-hours rate
// and raises work orders ahead of time so the planning desk can fit them around the timetable.

import type { VesselId, WorkOrder } from "./workOrder.js";
import type { RunningHoursTracker } from "./runningHoursTracker.js";

export interface PlannedTask {
  code: string;
  title: string;
  vesselId: VesselId;
  equipment: string;
  intervalHours?: number;
  intervalDays?: number;
  lastDoneAt: Date;
  lastDoneHours: number;
  /** Tasks that need the vessel out of service (dry dock, thruster overhaul). */
  needsLayup: boolean;
}

export interface DueForecast {
  task: PlannedTask;
  dueAt: Date;
  dueBy: "hours" | "days";
  hoursRemaining?: number;
}

export interface SchedulerOptions {
  leadDays: number;
  rateWindowDays: number;
}

export const DEFAULT_SCHEDULER_OPTIONS: SchedulerOptions = { leadDays: 14, rateWindowDays: 28 };

export function forecastDue(
  task: PlannedTask,
  hours: RunningHoursTracker,
  now: Date,
  options: SchedulerOptions = DEFAULT_SCHEDULER_OPTIONS,
): DueForecast {
  const candidates: DueForecast[] = [];
  if (task.intervalDays !== undefined) {
    candidates.push({
      task,
      dueAt: new Date(task.lastDoneAt.getTime() + task.intervalDays * 86_400_000),
      dueBy: "days",
    });
  }
  if (task.intervalHours !== undefined) {
    const current = hours.current(task.equipment) ?? task.lastDoneHours;
    const remaining = task.lastDoneHours + task.intervalHours - current;
    const rate = hours.dailyRate(task.equipment, now, options.rateWindowDays);
    const daysLeft = rate > 0 ? remaining / rate : Number.POSITIVE_INFINITY;
    const dueAt = Number.isFinite(daysLeft)
      ? new Date(now.getTime() + Math.max(0, daysLeft) * 86_400_000)
      : new Date(8.64e15);
    candidates.push({ task, dueAt, dueBy: "hours", hoursRemaining: remaining });
  }
  if (candidates.length === 0) {
    throw new Error(`Task ${task.code} has neither an hours nor a days interval`);
  }
  return candidates.reduce((a, b) => (a.dueAt <= b.dueAt ? a : b));
}

/** Work orders for tasks that fall due within the lead time, earliest first. */
export function dueWorkOrders(
  tasks: PlannedTask[],
  hours: RunningHoursTracker,
  now: Date,
  existing: WorkOrder[],
  options: SchedulerOptions = DEFAULT_SCHEDULER_OPTIONS,
): WorkOrder[] {
  const horizon = now.getTime() + options.leadDays * 86_400_000;
  const alreadyOpen = new Set(
    existing.filter((o) => o.state !== "verified" && o.taskCode).map((o) => `${o.vesselId}:${o.taskCode}`),
  );
  return tasks
    .map((task) => forecastDue(task, hours, now, options))
    .filter((f) => f.dueAt.getTime() <= horizon)
    .filter((f) => !alreadyOpen.has(`${f.task.vesselId}:${f.task.code}`))
    .sort((a, b) => a.dueAt.getTime() - b.dueAt.getTime())
    .map((f) => ({
      id: `WO-${f.task.vesselId}-${f.task.code}-${f.dueAt.toISOString().slice(0, 10)}`,
      vesselId: f.task.vesselId,
      kind: "planned" as const,
      title: f.task.title,
      equipment: f.task.equipment,
      state: "open" as const,
      raisedAt: now,
      dueBy: f.dueAt,
      taskCode: f.task.code,
      partsUsed: [],
      notes: f.task.needsLayup ? ["needs vessel out of service: agree dates with planning desk"] : [],
    }));
}

/** Shortens an interval after repeated problems, e.g. exchanger cleaning after running hot. */
export function tightenInterval(task: PlannedTask, factor: number): PlannedTask {
  if (factor <= 0 || factor >= 1) throw new Error("factor must be between 0 and 1");
  return {
    ...task,
    intervalHours: task.intervalHours !== undefined ? Math.round(task.intervalHours * factor) : undefined,
    intervalDays: task.intervalDays !== undefined ? Math.round(task.intervalDays * factor) : undefined,
  };
}
