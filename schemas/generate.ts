/**
 * Derives TypeScript from the JSON Schema files, which stay the single source of truth:
 * each generated module holds the schema document itself (for run-time checks) and the
 * static type that matches it. Run `npm run schemas` after editing a schema; the test
 * suite fails when a generated file is out of date.
 */
import { readFile, writeFile } from "node:fs/promises";
import { fileURLToPath } from "node:url";
import { dirname, join } from "node:path";
import { compile } from "json-schema-to-typescript";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");

export interface GeneratedModule {
  readonly schemaFile: string;
  readonly outputFile: string;
  readonly constName: string;
}

/** Which schema becomes which module. The scorer gets its own copy so it depends on nothing outside itself. */
export const generatedModules: readonly GeneratedModule[] = [
  {
    schemaFile: "schemas/dataset.schema.json",
    outputFile: "trainer/schema/dataset-schema.generated.ts",
    constName: "datasetSchemaDocument",
  },
  {
    schemaFile: "schemas/training-config.schema.json",
    outputFile: "trainer/schema/training-config.generated.ts",
    constName: "trainingConfigDocument",
  },
  {
    schemaFile: "schemas/scorer-artifact.schema.json",
    outputFile: "scorer/artifact.generated.ts",
    constName: "artifactSchemaDocument",
  },
];

/** Renders one module's text from its schema file. */
export async function renderModule(module: GeneratedModule): Promise<string> {
  const text = await readFile(join(root, module.schemaFile), "utf8");
  const schema = JSON.parse(text) as Parameters<typeof compile>[0];
  const types = await compile(schema, String(schema.title ?? "Root"), {
    bannerComment: "",
    additionalProperties: false,
    strictIndexSignatures: true,
    format: true,
    style: { printWidth: 100 },
    unreachableDefinitions: true,
    ignoreMinAndMaxItems: true,
  });
  return [
    `// Generated from ${module.schemaFile} by schemas/generate.ts: do not edit; run \`npm run schemas\`.`,
    "",
    `export const ${module.constName} = ${JSON.stringify(schema, null, 2)} as const;`,
    "",
    types,
  ].join("\n");
}

async function main(): Promise<void> {
  for (const module of generatedModules) {
    try {
      await readFile(join(root, module.schemaFile));
    } catch {
      continue; // a schema not written yet
    }
    await writeFile(join(root, module.outputFile), await renderModule(module));
    console.log(`schemas: wrote ${module.outputFile}`);
  }
}

if (process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1]) {
  await main();
}
