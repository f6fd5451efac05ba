// Tide predictions per station. Predictions arrive as high and low water events (time and height
// above chart datum); between events we interpolate with the usual cosine curve, which is good to
// a few centimetres on our coast and far better than linear interpolation near low water.

export interface TideEvent {
  time: Date;
  heightM: number;
  kind: "high" | "low";
}

export interface StationPredictions {
  station: string;
  events: TideEvent[];
}

interface RawStation {
  station: string;
  events: Array<{ time: string; heightM: number; kind: "high" | "low" }>;
}

export class TideTable {
  private readonly byStation = new Map<string, TideEvent[]>();

  constructor(predictions: StationPredictions[]) {
    for (const p of predictions) {
      const sorted = [...p.events].sort((a, b) => a.time.getTime() - b.time.getTime());
      this.byStation.set(p.station, sorted);
    }
  }

  static fromJson(raw: { stations: RawStation[] }): TideTable {
    return new TideTable(
      raw.stations.map((s) => ({
        station: s.station,
        events: s.events.map((e) => ({ time: new Date(e.time), heightM: e.heightM, kind: e.kind })),
      })),
    );
  }

  stations(): string[] {
    return [...this.byStation.keys()];
  }

  /** Predicted height above chart datum at an instant, or undefined outside the prediction range. */
  heightAt(station: string, at: Date): number | undefined {
    const events = this.byStation.get(station);
    if (!events || events.length < 2) return undefined;
    const t = at.getTime();
    for (let i = 0; i < events.length - 1; i++) {
      const a = events[i];
      const b = events[i + 1];
      if (t < a.time.getTime() || t > b.time.getTime()) continue;
      const span = b.time.getTime() - a.time.getTime();
      const fraction = span === 0 ? 0 : (t - a.time.getTime()) / span;
      // Cosine interpolation: slack near high and low water, fastest change at half tide.
      const weight = (1 - Math.cos(Math.PI * fraction)) / 2;
      return a.heightM + (b.heightM - a.heightM) * weight;
    }
    return undefined;
  }

  /** Is the tide rising (flood) or falling (ebb) at this instant? */
  stateAt(station: string, at: Date): "flood" | "ebb" | undefined {
    const events = this.byStation.get(station);
    if (!events) return undefined;
    const next = events.find((e) => e.time.getTime() > at.getTime());
    if (!next) return undefined;
    return next.kind === "high" ? "flood" : "ebb";
  }

  /** Low water events in a range; used by the planning desk to spot spring lows. */
  lowWaters(station: string, from: Date, to: Date): TideEvent[] {
    const events = this.byStation.get(station) ?? [];
    return events.filter(
      (e) => e.kind === "low" && e.time.getTime() >= from.getTime() && e.time.getTime() <= to.getTime(),
    );
  }

  /** Range (high minus following low) for each tide; large ranges mean springs. */
  ranges(station: string): Array<{ time: Date; rangeM: number }> {
    const events = this.byStation.get(station) ?? [];
    const result: Array<{ time: Date; rangeM: number }> = [];
    for (let i = 0; i < events.length - 1; i++) {
      if (events[i].kind === "high" && events[i + 1].kind === "low") {
        result.push({ time: events[i].time, rangeM: events[i].heightM - events[i + 1].heightM });
      }
    }
    return result;
  }
}
