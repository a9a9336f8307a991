// Temporary re-export while the gas module moves to src/gas/.
export * from "../gas/gas-types.js";
