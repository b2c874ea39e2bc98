/**
 * Write the corpus of bad and unusual workbooks into test/corpus/ with expected.json beside
 * them: `npx tsx scripts/buildCorpus.ts`. The cases and their expected outcomes are in
 * scripts/corpusCases.ts (invented data).
 */
import { mkdir, writeFile } from "node:fs/promises";
import { CORPUS } from "./corpusCases.js";

const dir = new URL("../test/corpus/", import.meta.url);
await mkdir(dir, { recursive: true });
for (const c of CORPUS) await writeFile(new URL(c.file, dir), await c.build());
const expected = CORPUS.map((c) => ({ name: c.name, file: c.file, expect: c.expect }));
await writeFile(new URL("expected.json", dir), JSON.stringify(expected, null, 1) + "\n");
console.log(`wrote ${CORPUS.length} cases to test/corpus/`);
