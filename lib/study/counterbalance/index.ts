export { williamsRows } from "./williamsRows";
export { cyclicRows } from "./cyclicRows";
export { allOrders } from "./allOrders";
export { randomRows } from "./randomRows";
export { seededUniform } from "./seededUniform";
export { counterbalancingRows } from "./counterbalancingRows";
export { orderForParticipant } from "./orderForParticipant";
export { plannedRowsWarning } from "./plannedRowsWarning";
export { betweenLevelsFor, betweenGroupCount } from "./betweenLevelsFor";
