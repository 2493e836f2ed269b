import { Field } from "@/components/ui/field";
import { ACCURACY_UNITS, type AccuracyQuantity, type AccuracySpecification } from "@/lib/instruments/accuracy";
import { ACCURACY_FIELDS } from "@/lib/instruments/instrument-form";

const TITLES: Record<AccuracyQuantity, string> = {
  current: "Current ±(% of reading + % of range)",
  voltage: "Voltage ±(% of reading + % of range)",
  resistance: "Resistance ±(% of reading + % of range)",
  temperature: "Temperature ± °C",
  mass: "Mass ± g",
  time: "Time base ± ppm",
};

const NAME: Record<AccuracyQuantity, string> = {
  current: "Current",
  voltage: "Voltage",
  resistance: "Resistance",
  temperature: "Temperature",
  mass: "Mass",
  time: "Time",
};

function labelOf(quantity: AccuracyQuantity, field: string): string {
  const unit = ACCURACY_UNITS[quantity];
  switch (field) {
    case "percentOfReading":
      return `${NAME[quantity]}: % of reading`;
    case "percentOfRange":
      return `${NAME[quantity]}: % of range`;
    case "range":
      return `${NAME[quantity]}: range (${unit})`;
    case "halfWidth":
      return `${NAME[quantity]}: limit (± ${unit})`;
    default:
      return `${NAME[quantity]}: limit (± ppm of elapsed time)`;
  }
}

/**
 * One quantity's part of the accuracy. A part the chosen kind does not use stays in the page but
 * disabled, so its values are neither sent nor lost when the kind is switched back.
 */
export function AccuracyFields({
  quantity,
  hidden,
  required,
  initial,
  errors,
}: {
  quantity: AccuracyQuantity;
  hidden: boolean;
  required: boolean;
  initial?: AccuracySpecification;
  errors: (key: string) => string[] | undefined;
}) {
  const part = initial?.[quantity] as Record<string, number> | undefined;
  const groupErrors = errors(`accuracy.${quantity}`);
  return (
    <fieldset disabled={hidden} hidden={hidden} className="rounded border border-rule bg-white p-3">
      <legend className="px-1 text-sm font-semibold">
        {TITLES[quantity]}
        {required ? "" : ", optional"}
      </legend>
      <div className="grid gap-3 sm:grid-cols-3">
        {ACCURACY_FIELDS[quantity].map((f) => (
          <Field
            key={f}
            label={labelOf(quantity, f)}
            name={`accuracy.${quantity}.${f}`}
            id={`field-accuracy-${quantity}-${f}`}
            inputMode="decimal"
            defaultValue={part?.[f]?.toString()}
            errors={errors(`accuracy.${quantity}.${f}`)}
          />
        ))}
      </div>
      {groupErrors && (
        <p role="alert" className="mt-1 text-sm text-deviates">
          {groupErrors.join(" ")}
        </p>
      )}
    </fieldset>
  );
}
