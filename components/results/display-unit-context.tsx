"use client";

import { createContext, useContext, useState, type ReactNode } from "react";
import type { DisplayUnit } from "@/lib/cases/display-unit";

type UnitState = { unit: DisplayUnit; setUnit: (u: DisplayUnit) => void };

const DisplayUnitContext = createContext<UnitState | null>(null);

/**
 * One display unit for everything on a case page: the results view's switch sets it, and the
 * equilibrium panel reads it, so a page in °C never shows a table in K beside it.
 */
export function DisplayUnitProvider({ initialUnit, children }: { initialUnit: DisplayUnit; children: ReactNode }) {
  const [unit, setUnit] = useState<DisplayUnit>(initialUnit);
  return <DisplayUnitContext.Provider value={{ unit, setUnit }}>{children}</DisplayUnitContext.Provider>;
}

/** The page's display unit, or `fallback` with a local switch where no provider is above (the report, tests). */
export function useDisplayUnit(fallback: DisplayUnit = "K"): UnitState {
  const shared = useContext(DisplayUnitContext);
  const [unit, setUnit] = useState<DisplayUnit>(fallback);
  return shared ?? { unit, setUnit };
}
