"use client";

import { createContext, useContext } from "react";

export interface FieldContextValue {
  /** The id of the control, from Field's htmlFor. */
  controlId: string;
  /** Ids of the hint and error text, for aria-describedby. */
  describedBy: string | undefined;
  invalid: boolean;
}

export const FieldContext = createContext<FieldContextValue | null>(null);

export function useField(): FieldContextValue | null {
  return useContext(FieldContext);
}

/** Merges a control's own props with what its Field knows. */
export function useControlProps(props: {
  id?: string;
  invalid?: boolean;
  "aria-describedby"?: string;
}): { id: string | undefined; invalid: boolean; describedBy: string | undefined } {
  const field = useField();
  const invalid = props.invalid ?? field?.invalid ?? false;
  const describedBy =
    [props["aria-describedby"], field?.describedBy].filter(Boolean).join(" ") || undefined;
  return { id: props.id ?? field?.controlId, invalid, describedBy };
}
