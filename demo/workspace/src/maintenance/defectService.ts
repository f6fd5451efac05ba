// Defects reported by crew. Each defect gets a number, a priority, and eventually a work order.
// See notes/maintenance/defect-reporting-guide.md for what the priorities mean on board.

import type { VesselId, WorkOrder } from "./workOrder.js";

export type Priority = "P1" | "P2" | "P3";

export interface Defect {
  id: string;
  vesselId: VesselId;
  location: string;
  description: string;
  reportedBy: string;
  reportedAt: Date;
  affectsSafety: boolean;
  priority?: Priority;
  workOrderId?: string;
  closedAt?: Date;
}

const DUE_DAYS: Record<Priority, number> = { P1: 0, P2: 7, P3: 90 };

// Words that should make the duty engineer look at a defect straight away.
const URGENT_HINTS = [
  "overheat", "running hot", "coolant", "smoke", "fire", "flood", "bilge", "steering",
  "thruster fault", "shutdown", "lifejacket", "liferaft", "watertight",
];

export class DefectRegister {
  private readonly defects: Defect[] = [];
  private sequence = 0;

  constructor(private readonly now: () => Date = () => new Date()) {}

  report(input: Omit<Defect, "id" | "reportedAt">): Defect {
    const year = this.now().getUTCFullYear();
    const defect: Defect = {
      ...input,
      id: `D-${year}-${String(++this.sequence).padStart(3, "0")}`,
      reportedAt: this.now(),
    };
    this.defects.push(defect);
    return defect;
  }

  /** Suggests a priority for the engineer on watch; the engineer has the final say. */
  suggestPriority(defect: Defect): Priority {
    if (defect.affectsSafety) return "P1";
    const text = defect.description.toLowerCase();
    if (URGENT_HINTS.some((hint) => text.includes(hint))) return "P1";
    if (/leak|noisy|vibrat|worn/.test(text)) return "P2";
    return "P3";
  }

  triage(id: string, priority: Priority): Defect {
    const defect = this.require(id);
    defect.priority = priority;
    return defect;
  }

  raiseWorkOrder(id: string, equipment: string): WorkOrder {
    const defect = this.require(id);
    const priority = defect.priority ?? this.suggestPriority(defect);
    const dueBy = new Date(this.now().getTime() + DUE_DAYS[priority] * 86_400_000);
    const order: WorkOrder = {
      id: `WO-${defect.id}`,
      vesselId: defect.vesselId,
      kind: "corrective",
      title: defect.description.slice(0, 80),
      equipment,
      state: "open",
      raisedAt: this.now(),
      dueBy,
      defectId: defect.id,
      partsUsed: [],
      notes: [],
    };
    defect.workOrderId = order.id;
    return order;
  }

  close(id: string): void {
    this.require(id).closedAt = this.now();
  }

  open(vesselId?: VesselId): Defect[] {
    return this.defects.filter((d) => !d.closedAt && (!vesselId || d.vesselId === vesselId));
  }

  private require(id: string): Defect {
    const defect = this.defects.find((d) => d.id === id);
    if (!defect) throw new Error(`Unknown defect ${id}`);
    return defect;
  }
}
