/** Points per plot the run's plots ask the server for (thinned there by LTTB). */
export const RUN_PLOT_POINTS = 2000;

/** The address of a run's plot data: the whole log against time, or one discharge step's V–Q curve. */
export function formatRunSeriesUrl(runId: string, step?: { stepId: string; cycle: number }): string {
  return step
    ? `/api/runs/${runId}/series?step=${encodeURIComponent(step.stepId)}&cycle=${step.cycle}&points=${RUN_PLOT_POINTS}`
    : `/api/runs/${runId}/series?points=${RUN_PLOT_POINTS}`;
}
