"use client";
import { useSyncExternalStore } from "react";

const subscribe = () => () => {};

/**
 * False during server rendering and hydration, true in the browser afterwards. The planners compute
 * in the browser only: the server's and the browser's floating point can differ in the last digit,
 * and that must not turn into a hydration mismatch (or cost the server a simulation per page view).
 */
export function useMounted(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
}
