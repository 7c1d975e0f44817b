// jstat is CommonJS; its default import is the jStat object under both tsx and vitest.
import jstatPkg from "jstat";

/** The jStat distributions the statistics use (types in lib/jstat.d.ts). */
export const jStat = jstatPkg;
