export { writeFileAtomic } from "./writeAtomic.js";
