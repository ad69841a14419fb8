// Test-only environment defaults. The test database is separate from the dev one (see scripts/lib/config.mjs).
process.env.HALFMAX_ENV ??= "test";
