/**
 * Loss coefficients of pipe fittings listed on a pipe, by Darby's 3-K method, and of concentric
 * reducers by Crane TP-410, added to the pipe's minor loss.
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

/** A fitting type whose K depends on the pipe's size only. */
export type FittingType = keyof typeof DARBY_FITTINGS | keyof typeof OTHER_FITTINGS;

/** Every fitting type name, for the schema: the size-only types, then the reducers. */
export const FITTING_TYPES = [
  ...Object.keys(DARBY_FITTINGS),
  ...Object.keys(OTHER_FITTINGS),
  "reducer",
  "expander",
] as (FittingType | ReducerType)[];

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

/**
 * Concentric reducers, listed on the pipe they leave: a `reducer` leads the flow into a smaller
 * pipe (a contraction), an `expander` into a larger one (an enlargement). Each sits at the
 * pipe's `to` end and is given by its included cone angle and the inside diameter it leads into.
 */
export const REDUCER_TYPES = ["reducer", "expander"] as const;

/** A reducer fitting type name. */
export type ReducerType = (typeof REDUCER_TYPES)[number];

/** Cone angles below this are gradual in Crane TP-410's formulas 1 and 3 [degrees]. */
const CRANE_GRADUAL_ANGLE = 45;

/**
 * Loss coefficient of a concentric reducer by Crane TP-410, referred to the velocity head in
 * the pipe the flow leaves (the pipe that lists it).
 *
 * With beta = d / D < 1 the ratio of the smaller to the larger inside diameter, theta the
 * included cone angle (180 degrees: a sudden step), and K_small referred to the smaller pipe:
 *
 * - contraction (reducer), theta < 45: K_small = 0.8 sin(theta / 2) (1 - beta^2) (formula 1)
 * - contraction, theta >= 45: K_small = 0.5 sqrt(sin(theta / 2)) (1 - beta^2) (formula 2)
 * - enlargement (expander), theta < 45: K_small = 2.6 sin(theta / 2) (1 - beta^2)^2 (formula 3)
 * - enlargement, theta >= 45: K_small = (1 - beta^2)^2 (formula 4, Borda-Carnot)
 *
 * The smaller pipe is downstream of a contraction and upstream of an enlargement. A velocity
 * head scales as 1 / d^4 at a given flow, so referred to the pipe the flow leaves:
 * K = K_small / beta^4 for a contraction (the pipe is the larger one), K = K_small for an
 * enlargement (the pipe is the smaller one).
 *
 * @param type - "reducer" (contraction) or "expander" (enlargement)
 * @param pipeDiameter - inside diameter of the pipe the flow leaves [m]
 * @param outletDiameter - inside diameter of the pipe it enters [m]: smaller for a reducer,
 *   larger for an expander
 * @param angle - included cone angle [degrees], 0 < angle <= 180
 * @returns K [-] referred to the velocity head in the pipe of `pipeDiameter`
 * @remarks Turbulent flow, incompressible loss coefficient. Source: Crane Co., Flow of Fluids
 *   Through Valves, Fittings, and Pipe, Technical Paper No. 410 (TP-410M), 2009, formulas 1 to 4
 *   as numbered in python3-fluids 1.0.22's source (the page was not checked). Crane refers K to
 *   the larger pipe, K_large = K_small / beta^4 (python3-fluids' notes to
 *   contraction_conical_Crane); python3-fluids 1.0.22 contraction_conical_Crane and
 *   diffuser_conical(method="Crane") return K_small, as the formulas above.
 * @example reducerLossCoefficient("reducer", 0.07792, 0.05248, 180) // 1.3277 (3 x 2 in Sch 40
 *   sudden contraction; checked in test/input/reducers.test.ts)
 */
export function reducerLossCoefficient(
  type: ReducerType,
  pipeDiameter: number,
  outletDiameter: number,
  angle: number,
): number {
  const halfAngleSine = Math.sin((angle * Math.PI) / 360);
  const gradual = angle < CRANE_GRADUAL_ANGLE;
  if (type === "reducer") {
    const beta = outletDiameter / pipeDiameter;
    const beta2 = beta * beta;
    const kSmall = gradual
      ? 0.8 * halfAngleSine * (1 - beta2)
      : 0.5 * Math.sqrt(halfAngleSine) * (1 - beta2);
    return kSmall / (beta2 * beta2);
  }
  const beta = pipeDiameter / outletDiameter;
  const areaLoss = 1 - beta * beta;
  return (gradual ? 2.6 * halfAngleSine : 1) * areaLoss * areaLoss;
}

/**
 * The part of a reducer's loss that a pipe adds to its minor loss: what the reducer loses
 * beyond the pipe's own exit velocity head, which the junction at its `to` end already takes.
 *
 * K_added = max(0, K - 1), K from reducerLossCoefficient (referred to this pipe).
 *
 * @param lossCoefficient - the reducer's K referred to this pipe's velocity head [-]
 * @returns K_added [-], referred to this pipe's velocity head
 * @remarks Every pipe ends in a junction, a plenum where its exit velocity head (K = 1) is lost
 *   and from which the next pipe starts isentropically (docs/model.md, "Pipe models"). A size
 *   change between two pipes therefore already costs the upstream pipe's velocity head; the
 *   reducer adds only its excess. An enlargement never loses more than the smaller pipe's
 *   velocity head (K <= 1 in formulas 3 and 4), so an expander adds nothing: the junction's
 *   loss is already the larger one (machnet errs towards more loss there). A contraction adds
 *   K_small / beta^4 - 1 where that is positive: about where beta < 0.71 for a sudden step.
 * @example reducerAddedLossCoefficient(1.3277) // 0.3277 (checked in test/input/reducers.test.ts)
 */
export function reducerAddedLossCoefficient(lossCoefficient: number): number {
  return Math.max(0, lossCoefficient - 1);
}
