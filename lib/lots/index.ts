// Lot services: the lot record, the sampling plan an engineer sets for it (ISO 2859-1) and the sample drawn under it.
export { createLot, editLot, lotInputSchema, type LotInput } from "./lot-records";
export { setLotSamplingPlan } from "./sampling/set-lot-sampling-plan";
export { drawLotSample } from "./sampling/draw-lot-sample";
export { replanForNewLotSize } from "./sampling/replan-for-lot-size";
export { computeSamplingPlan } from "./sampling/compute-sampling-plan";
