// The archive's CSV writer is the product's one CSV writer (lib/csv), formula triggers neutralised.
export { csvLine, csvField } from "../csv/csvField";
