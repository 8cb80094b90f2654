import type { FrontEndFamily, FrontEndParameters } from "./types";

const r = (x: number, digits = 0): string => {
  const f = 10 ** digits;
  return String(Math.round(x * f) / f);
};

/**
 * One plain sentence for people: what the spectrum resembles, with the fitted parameters that
 * matter. Always a resemblance ("resembles …"), never a statement of what is installed. The one
 * place these words are made; nothing parses them back.
 *
 * @example describeCandidate("six-pulse-capacitor", { acInductancePercent: 3, dcChokePercent: 0 }, true)
 * // "resembles a six-pulse diode bridge with a DC capacitor and about 3 % line reactance"
 */
export function describeCandidate(family: FrontEndFamily, p: FrontEndParameters, hasVoltage: boolean): string {
  switch (family) {
    case "single-phase-capacitor":
      return `resembles single-phase rectifier loads with DC capacitors (electronics power supplies) and about ${r(p.lineInductancePercent!, 1)} % line inductance`;
    case "six-pulse-capacitor": {
      const choke = p.dcChokePercent! >= 0.5 ? ` and a DC choke of about ${r(p.dcChokePercent!)} %` : "";
      return `resembles a six-pulse diode bridge with a DC capacitor and about ${r(p.acInductancePercent!, p.acInductancePercent! < 1 ? 1 : 0)} % line reactance${choke}`;
    }
    case "six-pulse-inductor":
      return `resembles a six-pulse bridge feeding a large DC inductance, with about ${r(p.commutationReactancePercent!)} % commutation reactance`;
    case "thyristor-bridge":
      return hasVoltage
        ? `resembles a phase-controlled thyristor bridge fired at about ${r(p.firingAngleDeg!)}° with about ${r(p.commutationReactancePercent!)} % commutation reactance`
        : `resembles a phase-controlled thyristor bridge with about ${r(p.commutationReactancePercent!)} % commutation reactance (firing angle uncertain without a voltage channel)`;
    case "twelve-pulse":
      return `resembles a twelve-pulse converter (two bridges on 30° shifted windings) with about ${r(p.imbalancePercent!)} % imbalance between bridges`;
    case "eighteen-pulse":
      return `resembles an eighteen-pulse converter (three bridges on 20° shifted windings) with about ${r(p.imbalancePercent!)} % imbalance between bridges`;
    case "symmetrical-angle":
      return `resembles a single-phase bridge conducting about ${r(p.conductionWidthDeg!)}° around each voltage peak`;
    case "active-front-end":
      return `resembles an active front end (PWM rectifier) with about ${r(p.lowOrderResidualPercent!, 1)} % low-order residual`;
    case "linear":
      return "resembles a linear load (resistive or motor): almost no harmonic current";
  }
}
