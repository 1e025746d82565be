/**
 * Imported FIRST by benches that reuse the API tests' in-process app: names a template database of
 * their own (tests/support/databases.ts reads the name when it is first imported), so a bench never
 * touches a test run's template.
 */
process.env.LARIAT_TEST_TEMPLATE ??= `lariat_bench_template_${process.pid}`;
