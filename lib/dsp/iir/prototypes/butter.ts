import type { Complex } from "../../types";
import type { Zpk } from "../zpk";
import { requireOrder } from "./order-check";

/**
 * Butterworth analog low-pass prototype, −3.0103 dB at 1 rad/s: poles −exp(jπm/(2N)), m = −N+1, −N+3, …, N−1
 * (Butterworth 1930, Wireless Engineer 7; scipy.signal buttap convention, middle pole exactly real).
 */
export function buttap(order: number): Zpk {
  requireOrder(order);
  const poles: Complex[] = [];
  for (let m = -order + 1; m < order; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    poles.push(m === 0 ? [-1, 0] : [-Math.cos(theta), -Math.sin(theta)]);
  }
  return { zeros: [], poles, gain: 1 };
}
