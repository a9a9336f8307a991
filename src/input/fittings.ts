/**
 * Loss coefficients of pipe fittings listed on a pipe, by Darby's 3-K method, added to the pipe's
 * minor loss.
 */
import { DARBY_FITTINGS } from "./fitting-data.js";

/**
 * Fitting types that are not in Darby's table: a sharp-edged entrance (K = 0.5) and an exit
 * (K = 0, because every pipe already loses its exit velocity head in the node it enters).
 */
const OTHER_FITTINGS = {
  "entrance-sharp": {
    lossCoefficient: 0.5,
    source:
      "flush sharp-edged entrance, K = 0.5: Crane TP-410, Idel'chik, Blevins and Swamee agree (python3-fluids 1.0.22 entrance_sharp(method='Crane'))",
  },
  exit: {
    lossCoefficient: 0,
    source: "counted by the pipe model: the exit kinetic energy (K = 1) is lost in the node",
  },
} as const;

/** A fitting type name. */
export type FittingType = keyof typeof DARBY_FITTINGS | keyof typeof OTHER_FITTINGS;

/** Every fitting type name, for the schema. */
export const FITTING_TYPES = [
  ...Object.keys(DARBY_FITTINGS),
  ...Object.keys(OTHER_FITTINGS),
] as FittingType[];

/**
 * Loss coefficient of one fitting in turbulent flow, by Darby's 3-K method:
 *
 * K = K1 / Re + Ki (1 + Kd / Dn^0.3), taken at Re -> infinity: K = Ki (1 + Kd / Dn^0.3)
 *
 * @param type - a machnet fitting type (FITTING_TYPES)
 * @param nominalPipeSize - Dn, the nominal size [in]
 * @returns K [-], referred to the velocity head in the pipe
 * @remarks The K1 / Re term is left out: the pipe's minor loss is a constant. It is at most
 *   2000 / Re (lift check valve), 0.02 at Re = 1e5, against K = 0.05 to 6 for the others; below
 *   Re ~ 1e4 it is not negligible for elbows and tees. Source: P. Silverberg and R. Darby,
 *   Chemical Engineering 106 (7), July 1999, p. 101; constants from python3-fluids 1.0.22
 *   (src/input/fitting-data.ts). The entrance and exit are not in Darby's table (see
 *   OTHER_FITTINGS).
 * @example fittingLossCoefficient("elbow-90", 2) // 0.3867 (python3-fluids 1.0.22 Darby3K at
 *   Re -> infinity; checked in test/input/components.test.ts)
 */
export function fittingLossCoefficient(type: FittingType, nominalPipeSize: number): number {
  if (type in OTHER_FITTINGS) {
    return OTHER_FITTINGS[type as keyof typeof OTHER_FITTINGS].lossCoefficient;
  }
  const constants = DARBY_FITTINGS[type as keyof typeof DARBY_FITTINGS];
  return constants.kInfinity * (1 + constants.kDiameter / nominalPipeSize ** 0.3);
}
