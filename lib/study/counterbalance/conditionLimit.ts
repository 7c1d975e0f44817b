/** The most conditions a Latin square (Williams, cyclic) or a set of random orders is built for. */
export const MAX_SQUARE_CONDITIONS = 64;
/** The most conditions "all orders" takes: 4! = 24 rows; 5! = 120 would already ask for 120 people per replication. */
export const MAX_ALL_ORDERS_CONDITIONS = 4;

/**
 * How many conditions a counterbalancing method can order (conditionLimit): 4 for every order,
 * 64 for the squares and random orders. The design schema refuses more at the method's field, so
 * that no saved design reaches a builder that cannot order it. Cost: O(1).
 * @throws never.
 * @example conditionLimit("all-orders") // 4
 */
export function conditionLimit(method: "williams" | "cyclic" | "all-orders" | "random"): number {
  return method === "all-orders" ? MAX_ALL_ORDERS_CONDITIONS : MAX_SQUARE_CONDITIONS;
}
