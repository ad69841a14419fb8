import type { GrayImage } from "../analysis/types";

/** A synthetic phantom image together with the truth it was generated from (for tests, demo and benchmarks). */
export interface Phantom<Truth> {
  image: GrayImage;
  truth: Truth;
}
