// The public surface of src/licence: re-exports only.
export { parseDesignator, type ParsedDesignator } from "./designator.js";
