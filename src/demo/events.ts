/**
 * The process event log of the demo plant: resin lot changes, dryer dew-point excursions, hot-runner and
 * chiller maintenance, a gauge recalibration, a check-instruction trial and the weekly crew rotations.
 * Each event sits between two checks, so it is unambiguous which subgroups came before and after it.
 */
import type { CauseCategory, EventKind } from "@/shared/constants";
import type { Rng } from "@/src/spc/random";
import {
  CAVITY_MIXTURE,
  CHILLER_CYCLE,
  DEW_POINT_EXCURSIONS,
  HEATER_DRIFT,
  SHIFTS,
} from "./plant";
import { timeBefore, type PressSchedule } from "./schedule";
import type { DemoEvent, DemoProcessKey } from "./types";

/** Routine checks that found nothing wrong: candidate causes an investigation can rule out. */
const ROUTINE_HOT_RUNNER_MAINTENANCE: Readonly<Record<DemoProcessKey, number>> = { "press-1": 300, "press-2": 150 };
const HEIGHT_GAUGE_CALIBRATION = 700;
/** An operator raises the zone 6 set point part-way into the heater-band failure; it does not help. */
const ZONE_SET_POINT_RAISED = 430;

export interface ResinLot {
  readonly start: number;
  readonly name: string;
  /** Melt flow index on the supplier's certificate (g/10 min). */
  readonly meltFlowIndex: number;
}

function event(
  processKey: DemoProcessKey,
  occurredAt: Date,
  kind: EventKind,
  causeCategory: CauseCategory | null,
  description: string,
  reading?: { value: number; unit: string },
): DemoEvent {
  return {
    processKey,
    occurredAt,
    kind,
    causeCategory,
    description,
    value: reading?.value ?? null,
    unit: reading?.unit ?? null,
  };
}

function oneDecimal(value: number): number {
  return Math.round(value * 10) / 10;
}

export function lotChangeEvents(
  processKey: DemoProcessKey,
  schedule: PressSchedule,
  lots: readonly ResinLot[],
): DemoEvent[] {
  return lots
    .filter((lot) => lot.start > 0)
    .map((lot) =>
      event(
        processKey,
        timeBefore(schedule.times, lot.start),
        "lot-change",
        "material",
        `Resin lot changed to ${lot.name} (certificate melt flow index ${lot.meltFlowIndex.toFixed(1)} g/10 min)`,
      ),
    );
}

export function crewRotationEvents(processKey: DemoProcessKey, schedule: PressSchedule): DemoEvent[] {
  return schedule.rotations.map((rotation) => {
    const crews = SHIFTS.map((shift, index) => `${shift.name} ${rotation.operatorByShift[index] ?? "?"}`);
    return event(processKey, rotation.at, "operator-change", "people", `Weekly crew rotation: ${crews.join(", ")}`);
  });
}

export function pressOneEvents(schedule: PressSchedule, rng: Rng): DemoEvent[] {
  const times = schedule.times;
  const events: DemoEvent[] = [];
  for (const excursion of DEW_POINT_EXCURSIONS) {
    const high = oneDecimal(-15 - 6 * rng.uniform());
    const recovered = oneDecimal(-39 - 3 * rng.uniform());
    events.push(
      event("press-1", timeBefore(times, excursion.before), "environment", "environment",
        `Resin dryer dew point high at ${high} °C (normally about -40 °C)`, { value: high, unit: "°C" }),
      event("press-1", timeBefore(times, excursion.before + excursion.duration), "environment", "environment",
        `Resin dryer dew point back to ${recovered} °C after desiccant regeneration`, { value: recovered, unit: "°C" }),
    );
  }
  const midCycle = CHILLER_CYCLE.first + Math.round(4.5 * CHILLER_CYCLE.period);
  const waterTemperature = oneDecimal(16.5 + rng.uniform());
  events.push(
    event("press-1", timeBefore(times, ROUTINE_HOT_RUNNER_MAINTENANCE["press-1"]), "maintenance", "machine",
      "Preventive hot-runner maintenance: nozzle tips cleaned, heater resistances within tolerance"),
    event("press-1", timeBefore(times, midCycle), "environment", "environment",
      `Mould cooling water supply read ${waterTemperature} °C (set point 12 °C)`, { value: waterTemperature, unit: "°C" }),
    event("press-1", timeBefore(times, CHILLER_CYCLE.last + 1), "maintenance", "machine",
      "Chiller condenser cleaned and refrigerant charge topped up; cooling water steady at 12 °C"),
  );
  return events;
}

export function pressTwoEvents(schedule: PressSchedule): DemoEvent[] {
  const times = schedule.times;
  return [
    event("press-2", timeBefore(times, ROUTINE_HOT_RUNNER_MAINTENANCE["press-2"]), "maintenance", "machine",
      "Preventive hot-runner maintenance: nozzle tips cleaned, heater resistances within tolerance"),
    event("press-2", timeBefore(times, ZONE_SET_POINT_RAISED), "setting-change", "method",
      "Hot-runner zone 6 set point raised from 230 °C to 238 °C to chase short shots"),
    event("press-2", timeBefore(times, HEATER_DRIFT.last + 1), "maintenance", "machine",
      "Hot-runner maintenance: zone 6 heater band found open-circuit when hot and replaced; set point back to 230 °C"),
    event("press-2", timeBefore(times, HEIGHT_GAUGE_CALIBRATION), "calibration", "measurement",
      "Cap-height gauge recalibrated against an 18.000 mm gauge block; as-found error +0.004 mm, within tolerance"),
    event("press-2", timeBefore(times, CAVITY_MIXTURE.first), "setting-change", "method",
      `Cap-height check instruction trial: take the sample from cavities ${CAVITY_MIXTURE.highCavity} and ` +
        `${CAVITY_MIXTURE.lowCavity} in turn`),
    event("press-2", timeBefore(times, CAVITY_MIXTURE.last + 1), "setting-change", "method",
      `Cap-height check instruction restored: sample from cavity ${CAVITY_MIXTURE.usualCavity}`),
  ];
}
