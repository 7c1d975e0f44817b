export { designSummary, PLANNING, type DesignSummary } from "./designSummary";
export { orderPreview, type OrderPreview } from "./orderPreview";
