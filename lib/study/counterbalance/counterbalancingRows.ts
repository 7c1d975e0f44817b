import { conditionsOf, type StudyDesign } from "../design";
import { allOrders } from "./allOrders";
import { cyclicRows } from "./cyclicRows";
import { randomRows } from "./randomRows";
import { williamsRows } from "./williamsRows";

/**
 * The counterbalancing rows of a design (counterbalancingRows): one condition order per row, as
 * indices into conditionsOf(design), by the design's method:
 * - "williams": balanced Latin square (Williams 1949), n rows for even n, 2n for odd n;
 * - "cyclic": cyclic Latin square, n rows;
 * - "all-orders": every order, n! rows (at most 4 conditions);
 * - "random": plannedParticipants random orders from counterbalancing.seed.
 *
 * Cost: that of the chosen builder.
 * @throws Error when the design has no conditions, or "all-orders" is chosen with more than 4.
 * @example counterbalancingRows(design2x2Williams) // [[0,1,3,2],[1,2,0,3],[2,3,1,0],[3,0,2,1]]
 */
export function counterbalancingRows(design: StudyDesign): number[][] {
  const n = conditionsOf(design).length;
  if (n === 0) throw new Error("counterbalancingRows requires at least 1 condition");
  switch (design.counterbalancing.method) {
    case "williams":
      return williamsRows(n);
    case "cyclic":
      return cyclicRows(n);
    case "all-orders":
      return allOrders(n);
    case "random":
      return randomRows(n, design.counterbalancing.seed, design.plannedParticipants);
  }
}
