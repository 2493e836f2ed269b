/** A deviating finding as the review form shows it (plain, serialisable). */
export interface DeviationItem {
  id: string;
  /** The step and cycle, or "the run as a whole". */
  where: string;
  title: string;
  expected: string;
  observed: string;
  clause: string;
  safety: boolean;
}
