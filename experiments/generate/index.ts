export { generateTrialRows, generatorOptionsSchema, type GeneratorOptions } from "./generateTrialRows";
export { writeTrialTable } from "./writeTrialTable";
export { seededRandom, normalFrom } from "./random";
