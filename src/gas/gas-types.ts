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

/**
 * One species of a NASA 7-coefficient ideal-gas heat capacity: two temperature ranges that meet
 * at `commonTemperature`, each with seven coefficients a1..a7 of
 * Cp/Ru = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4,
 * H/(Ru T) = a1 + a2 T/2 + a3 T^2/3 + a4 T^3/4 + a5 T^4/5 + a6/T,
 * S°/Ru = a1 ln T + a2 T + a3 T^2/2 + a4 T^3/3 + a5 T^4/4 + a7.
 */
export interface Nasa7Species {
  /** Species name, for messages and docs ("N2"). */
  name: string;
  /** x_i [-], within the gas (the fractions of one gas sum to 1). */
  moleFraction: number;
  /** M_i [kg/mol]. */
  molarMass: number;
  /** Lower end of the low range [K]. */
  lowTemperature: number;
  /** Where the two ranges meet [K] (usually 1000 K). */
  commonTemperature: number;
  /** Upper end of the high range [K]. */
  highTemperature: number;
  /** a1..a7 of the range lowTemperature..commonTemperature. */
  lowCoefficients: number[];
  /** a1..a7 of the range commonTemperature..highTemperature. */
  highCoefficients: number[];
}

/** Temperature-dependent ideal-gas heat capacity: ideal mixing of NASA 7-coefficient species. */
export interface Nasa7HeatCapacity {
  kind: "nasa7";
  species: Nasa7Species[];
}

/** One component of a Peng-Robinson gas. */
export interface PengRobinsonComponent {
  /** Component name, for messages and docs ("methane"). */
  name: string;
  /** x_i [-], within the gas (the fractions of one gas sum to 1). */
  moleFraction: number;
  /** Tc [K]. */
  criticalTemperature: number;
  /** pc [Pa]. */
  criticalPressure: number;
  /** omega [-]. */
  acentricFactor: number;
  /** M_i [kg/mol]. */
  molarMass: number;
}

/**
 * The Peng-Robinson (1976) equation of state with van der Waals one-fluid mixing rules.
 * `binaryInteraction[i][j]` is k_ij (symmetric, zero diagonal); absent means all k_ij = 0.
 */
export interface PengRobinsonEquationOfState {
  kind: "peng-robinson";
  components: PengRobinsonComponent[];
  binaryInteraction?: number[][];
}

/**
 * A gas. By default calorically perfect (constant cp) and ideal (p = rho R T); the optional
 * `heatCapacity` and `equationOfState` data make src/gas/thermo.ts use temperature-dependent cp
 * and a real-gas equation of state. `specificHeatCp` and `heatCapacityRatio` always hold the
 * reference-state (298.15 K, ideal-gas) values that the perfect-gas models use.
 */
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
  /** Ideal-gas cp(T) data; absent: constant `specificHeatCp`. */
  heatCapacity?: Nasa7HeatCapacity;
  /** Equation of state; absent: ideal gas, Z = 1. */
  equationOfState?: PengRobinsonEquationOfState;
}
