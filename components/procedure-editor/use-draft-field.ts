import { useCallback, useState } from "react";
import { get, useFormContext, useFormState, useWatch } from "react-hook-form";
import { flattenFieldErrors, selectOwnMessages } from "./field-paths";

// The editor's inputs are not registered with react-hook-form: each reads its value with useWatch
// and writes with setValue. Registered fields would be refilled from the form's first values when
// they mount empty, which after steps are moved or removed would be another step's value. The
// whole draft is checked by the zod resolver on save, and after a failed save on every change.

/** The current value at a form path. */
export function useDraftValue<T>(path: string): T {
  const { control } = useFormContext();
  return useWatch({ control, name: path }) as T;
}

/** Checks the whole draft again, once a save has been tried (a change can mend or break another field). */
export function useRevalidate(): () => void {
  const { trigger, control } = useFormContext();
  const { isSubmitted } = useFormState({ control });
  return useCallback(() => {
    if (isSubmitted) void trigger();
  }, [trigger, isSubmitted]);
}

/** Writes a value at a form path. */
export function useUpdateDraft(): (path: string, value: unknown) => void {
  const { setValue } = useFormContext();
  const revalidate = useRevalidate();
  return useCallback(
    (path: string, value: unknown) => {
      setValue(path, value, { shouldDirty: true, shouldTouch: true });
      revalidate();
    },
    [setValue, revalidate],
  );
}

/** Every error message at this path or below it. */
export function useSubtreeErrors(path: string) {
  const { control } = useFormContext();
  const { errors } = useFormState({ control, name: path });
  return flattenFieldErrors(get(errors, path), path);
}

/** Error messages recorded at exactly this path (client check or server answer). */
export function usePathErrors(path: string): string[] {
  const { control } = useFormContext();
  const { errors } = useFormState({ control, name: path });
  return selectOwnMessages(flattenFieldErrors(get(errors, path), path), path);
}

/**
 * Text typed into an input whose form value is parsed from it (a number, a list of notes): the text
 * is kept as typed, and replaced only when the form value changes to something the text does not
 * already mean (e.g. a step moved or a kind switched).
 */
export function useTypedText<T>(value: T, { format, parse }: { format: (value: T) => string; parse: (text: string) => T }) {
  const [text, setText] = useState(() => format(value));
  const [seen, setSeen] = useState(value);
  if (JSON.stringify(value) !== JSON.stringify(seen)) {
    setSeen(value);
    if (JSON.stringify(parse(text)) !== JSON.stringify(value)) setText(format(value));
  }
  return [text, setText] as const;
}
