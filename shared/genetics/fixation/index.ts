// Filled in by the topic's author; re-exported from shared/genetics/index.ts.
export {}
