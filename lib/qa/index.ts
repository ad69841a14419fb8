/** QA logic for baselines, tolerances, control limits, schedules, alerts and delivery retries. Framework-free. */
export * from "./qa-error";
export * from "./metrics";
export * from "./tolerance";
export * from "./default-tolerances";
export * from "./baseline";
export * from "./control-limits";
export * from "./schedule";
export * from "./alert-rules";
export * from "./retry";
