// The public surface of src/measure: re-exports only.
export { measurement, notAvailable, type Measurement } from "./measurement.js";
