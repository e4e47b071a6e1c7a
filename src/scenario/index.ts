export { SeededRandom, complexNoise } from "./random.js";
