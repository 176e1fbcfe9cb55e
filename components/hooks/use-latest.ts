"use client";

import { useInsertionEffect, useRef, type RefObject } from "react";

/**
 * A ref that always holds the latest committed `value`, for callbacks and effects that must read it
 * without re-subscribing. It is written in an insertion effect, which runs before every layout and
 * passive effect of the same commit, so no effect ever sees the previous render's value.
 */
export function useLatest<T>(value: T): RefObject<T> {
  const ref = useRef(value);
  useInsertionEffect(() => {
    ref.current = value;
  });
  return ref;
}
