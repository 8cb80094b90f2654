// The system's nominal voltage (a site's, or the command line's --nominal-voltage) stands for two
// context values: the bus voltage that chooses the IEEE 519 table, and the nominal voltage of the
// measured voltage channels that %Vnom limits refer to.
import type { EvaluationContext } from "@/lib/compliance/model";

/** Above this a system's nominal voltage is taken as line-to-line (common practice, no source). */
export const lineToLineAboveV = 250;

/**
 * Fills the bus voltage and the channels' nominal voltage from a system's nominal voltage where
 * they were not given:
 * - bus voltage (line-to-line at the PCC, chooses the IEEE 519 table) = the system voltage, marked
 *   `busVoltageSource: "system-nominal"` so the sheet can say which voltage chose the band;
 * - channel nominal voltage (basis of %Vnom): a system voltage above 250 V is a line-to-line value
 *   and the channels measure line-to-neutral, so V/√3 rounded to the volt (400 V → 231 V,
 *   11 kV → 6351 V); 250 V and below is a single-phase line-to-neutral value taken as it is
 *   (230 V → 230 V). Values given explicitly win.
 *
 * @param systemV nominal system voltage, V (> 0)
 * @example
 * voltageContextFromSystem(11000, {}) // { busVoltageV: 11000, busVoltageSource: "system-nominal", nominalVoltageV: 6351 }
 */
export function voltageContextFromSystem(
  systemV: number,
  given: Pick<EvaluationContext, "busVoltageV" | "nominalVoltageV">,
): Pick<EvaluationContext, "busVoltageV" | "busVoltageSource" | "nominalVoltageV"> {
  const channelV = systemV > lineToLineAboveV ? Math.round(systemV / Math.sqrt(3)) : systemV;
  return {
    ...(given.busVoltageV !== undefined ? { busVoltageV: given.busVoltageV, busVoltageSource: "given" as const } : { busVoltageV: systemV, busVoltageSource: "system-nominal" as const }),
    nominalVoltageV: given.nominalVoltageV ?? channelV,
  };
}
