// Job kinds register themselves here; the worker imports this once.
export {};
