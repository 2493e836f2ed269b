import { Notice } from "@/components/ui/notice";

/** Which results the statistics, tables and exports rest on, said once per page. */
export function ResultsBasisNote() {
  return (
    <Notice title="Which results count">
      Only reviewed runs (accepted or certified), with the evaluation the accepting reviewer signed for. Each capacity discharge at the 20 °C test ambient after a charge is
      one result; precondition discharges and discharges after storage or a cold soak are left out. Currents are the mean measured current of each discharge.
    </Notice>
  );
}
