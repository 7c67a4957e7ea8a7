export { stridedWeightedSum, ratioIndependent, type ValueWithError } from "./weightedSum.js";
export {
  photocurrentSummary,
  PHOTOCURRENT_FORMAT,
  type PhotocurrentSummary,
  type DirectionPhotocurrent,
  type ChannelCurrent,
} from "./photocurrent.js";
export { iamCsv, IAM_CSV_COLUMNS } from "./iamCsv.js";
export { formatPhotocurrentTable, textTable } from "./table.js";
export { writePhotocurrentSummary, photocurrentForMatrix, PHOTOCURRENT_FILE, IAM_FILE } from "./writePhotocurrent.js";
