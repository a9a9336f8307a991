/**
 * The gas as the solver sees it: plain data (no functions), so it can be copied into worker
 * threads and serialised into results. All values SI.
 */

/** Viscosity by Sutherland's law: mu = mu0 (T/T0)^1.5 (T0 + S)/(T + S). */
export interface SutherlandViscosity {
  kind: "sutherland";
  /** mu0 [Pa s] at the reference temperature. */
  referenceViscosity: number;
  /** T0 [K]. */
  referenceTemperature: number;
  /** S [K]. */
  sutherlandConstant: number;
}

/** A viscosity that does not depend on temperature [Pa s]. */
export interface ConstantViscosity {
  kind: "constant";
  viscosity: number;
}

/** A mixture's viscosity by Wilke's rule from its components' own laws. */
export interface WilkeViscosity {
  kind: "wilke";
  components: {
    moleFraction: number;
    molarMass: number;
    law: SutherlandViscosity | ConstantViscosity;
  }[];
}

export type ViscosityLaw = SutherlandViscosity | ConstantViscosity | WilkeViscosity;

/** A calorically perfect (ideal, constant cp) gas. */
export interface Gas {
  /** Display name ("air", "nitrogen", "custom", "mixture"). */
  name: string;
  /** M [kg/mol]. */
  molarMass: number;
  /** R = Ru / M [J/(kg K)], Ru the CODATA 2018 molar gas constant. */
  specificGasConstant: number;
  /** gamma = cp / cv [-]. */
  heatCapacityRatio: number;
  /** cp = gamma R / (gamma - 1) [J/(kg K)]. */
  specificHeatCp: number;
  viscosityLaw: ViscosityLaw;
}
