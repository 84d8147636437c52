"use client";
import { createContext, useContext, useMemo, type ReactNode } from "react";
import {
  formatDay,
  formatDayRange,
  localiseDates,
  type DateStyle,
  type DayOptions,
} from "@/features/platform/lib/date-format";

/** The signed-in person's date style (platform/lib/date-format.ts), set once for the page by the root layout. */
const DateStyleContext = createContext<DateStyle>("iso");

export function DateStyleProvider({ style, children }: { style: DateStyle; children: ReactNode }) {
  return <DateStyleContext.Provider value={style}>{children}</DateStyleContext.Provider>;
}

export interface Dates {
  style: DateStyle;
  /** A calendar date (YYYY-MM-DD) as the reader writes dates. */
  day: (ymd: string, options?: DayOptions) => string;
  range: (from: string, to: string) => string;
  /** A sentence from the server with its ISO dates in the reader's style. */
  text: (sentence: string) => string;
}

export function useDates(): Dates {
  const style = useContext(DateStyleContext);
  return useMemo(
    () => ({
      style,
      day: (ymd, options) => formatDay(ymd, style, options),
      range: (from, to) => formatDayRange(from, to, style),
      text: (sentence) => localiseDates(sentence, style),
    }),
    [style],
  );
}

/** A calendar date in the reader's style, machine-readable in its dateTime. */
export function Day({ value, weekday, year }: { value: string; weekday?: boolean; year?: boolean }) {
  const { day } = useDates();
  return <time dateTime={value}>{day(value, { weekday, year })}</time>;
}

/** A sentence written by the server (a fix, a warning, a note) with its dates in the reader's style. */
export function Said({ children }: { children: string }) {
  const { text } = useDates();
  return <>{text(children)}</>;
}
