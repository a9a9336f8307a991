export * from "../model/gas.js";
