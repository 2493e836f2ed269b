// Lot sampling services (ISO 2859-1): the plan an engineer sets for a lot and the sample drawn under it.
export { setLotSamplingPlan } from "./set-lot-sampling-plan";
export { drawLotSample } from "./draw-lot-sample";
export { replanForNewLotSize } from "./replan-for-lot-size";
export { computeSamplingPlan } from "./compute-sampling-plan";
