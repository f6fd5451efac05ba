// Work orders: a unit of maintenance work on one vessel, planned or raised from a defect.

export type VesselId = "sule-lass" | "kittiwake-dawn" | "brannagh";

export type WorkOrderKind = "planned" | "corrective" | "survey";

export type WorkOrderState = "open" | "assigned" | "in-progress" | "awaiting-parts" | "done" | "verified";

export interface PartUse {
  partNumber: string;
  quantity: number;
}

export interface WorkOrder {
  id: string;
  vesselId: VesselId;
  kind: WorkOrderKind;
  title: string;
  equipment: string;
  state: WorkOrderState;
  raisedAt: Date;
  dueBy?: Date;
  assignee?: string;
  defectId?: string;
  taskCode?: string;
  runningHoursAtCompletion?: number;
  partsUsed: PartUse[];
  notes: string[];
}

const TRANSITIONS: Record<WorkOrderState, WorkOrderState[]> = {
  open: ["assigned"],
  assigned: ["in-progress", "open"],
  "in-progress": ["awaiting-parts", "done"],
  "awaiting-parts": ["in-progress"],
  done: ["verified", "in-progress"],
  verified: [],
};

export class WorkOrderStateError extends Error {
  constructor(id: string, from: WorkOrderState, to: WorkOrderState) {
    super(`Work order ${id} cannot move from ${from} to ${to}`);
  }
}

export function transition(order: WorkOrder, to: WorkOrderState, note?: string): WorkOrder {
  if (!TRANSITIONS[order.state].includes(to)) {
    throw new WorkOrderStateError(order.id, order.state, to);
  }
  return { ...order, state: to, notes: note ? [...order.notes, note] : order.notes };
}

export function isOverdue(order: WorkOrder, now: Date): boolean {
  return order.dueBy !== undefined && order.state !== "done" && order.state !== "verified" && order.dueBy < now;
}

/** Completing a planned task records the running hours so the scheduler can plan the next one. */
export function complete(order: WorkOrder, runningHours: number, parts: PartUse[], note: string): WorkOrder {
  const done = transition(order, "done", note);
  return { ...done, runningHoursAtCompletion: runningHours, partsUsed: [...order.partsUsed, ...parts] };
}
