"use client";
import { useSyncExternalStore } from "react";

const noSubscription = () => () => {};

/**
 * False while the server's HTML shows and the page's script has not taken it over yet (pages stream in behind a loading
 * state, so parts hydrate later than others); true from then on. Forms disable their controls until then, so that a
 * choice made too early is not silently dropped.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}
