'use client';

import { useEffect, useRef, useState } from 'react';

/** The width of a box as it changes (a figure's width follows its box). */
export function useBoxWidth<T extends HTMLElement = HTMLDivElement>() {
  const box = useRef<T>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const element = box.current;
    if (!element) return;
    const observer = new ResizeObserver(([entry]) => setWidth(Math.floor(entry.contentRect.width)));
    observer.observe(element);
    return () => observer.disconnect();
  }, []);
  return { box, width };
}
