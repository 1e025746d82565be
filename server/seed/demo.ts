// Seeds the demo workspace (idempotent).
export {};
