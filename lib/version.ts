import pkg from "@/package.json";
import { ANALYSIS_VERSION } from "@/lib/analysis/types";

export const APP_VERSION: string = pkg.version;
export { ANALYSIS_VERSION };
