// Loaded by index.html before the app's modules. Zod compiles object parsers with `new Function`
// when it can, and probes for that by trying it when each schema is built; under Lariat's content
// security policy (script-src 'self', no 'unsafe-eval') the probe is reported as a violation. Zod
// reads this global when it loads, so it never tries; its interpreted parser is fast enough for forms.
globalThis.__zod_globalConfig = Object.assign(globalThis.__zod_globalConfig || {}, { jitless: true });
