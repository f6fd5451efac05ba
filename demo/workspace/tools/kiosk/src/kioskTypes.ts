// Types shared by the quayside kiosk. These mirror src/ticketing/bookingModel.ts but the kiosk is
// built separately (it runs on the terminal PC with no network at night), so it keeps its own copy.

export type PassengerType = "adult" | "child" | "senior" | "islander" | "companion";

export type VehicleType = "none" | "car" | "van" | "campervan" | "commercial" | "motorcycle" | "bicycle";

export interface KioskSale {
  localId: string;
  soldAt: string;
  sailingId: string;
  passengers: Array<{ type: PassengerType; count: number }>;
  vehicle: VehicleType;
  totalPence: number;
  cardLast4?: string;
  uploaded: boolean;
}

/** Sales made while offline are queued and uploaded when the link to the service returns. */
export class OfflineQueue {
  private readonly sales: KioskSale[] = [];

  push(sale: KioskSale): void {
    this.sales.push({ ...sale, uploaded: false });
  }

  pending(): KioskSale[] {
    return this.sales.filter((s) => !s.uploaded);
  }

  markUploaded(localIds: string[]): number {
    let count = 0;
    for (const sale of this.sales) {
      if (!sale.uploaded && localIds.includes(sale.localId)) {
        sale.uploaded = true;
        count++;
      }
    }
    return count;
  }

  /** Sales on a sailing that was cancelled while the kiosk was offline need a refund at the desk. */
  onSailing(sailingId: string): KioskSale[] {
    return this.sales.filter((s) => s.sailingId === sailingId);
  }
}

export function receiptLine(sale: KioskSale): string {
  const pounds = (sale.totalPence / 100).toFixed(2);
  return `${sale.soldAt.slice(0, 16)}  ${sale.sailingId}  £${pounds}`;
}
