// Child process of atomic-write-kill.test.ts: writes generation after
// generation of three large files through the tool's own writers (built, from
// dist/) until it is killed, printing "done <target> <generation>" after each
// write returns. Usage: node atomic-writer-child.mjs <dir> <first generation>
import { join } from "node:path";
import process from "node:process";
import { writeFileAtomic } from "../../dist/trainer/io/write-file-atomic.js";
import { writeDataFile } from "../../dist/trainer/data/write-data-file.js";
import { RejectsWriter } from "../../dist/trainer/data/rejects-writer.js";
import { blobOf, CSV_ROWS, REJECT_ROWS } from "./atomic-write-contents.mjs";

const [dir, first] = process.argv.slice(2);
for (let g = Number(first); ; g++) {
  await writeFileAtomic(join(dir, "blob.bin"), blobOf(g));
  process.stdout.write(`done blob.bin ${g}\n`);

  const columns = [
    { name: "generation", type: "int" },
    { name: "row", type: "int" },
  ];
  function* batches() {
    for (let s = 0; s < CSV_ROWS; s += 50_000) {
      const n = Math.min(50_000, CSV_ROWS - s);
      const row = new Int32Array(n);
      for (let i = 0; i < n; i++) row[i] = s + i;
      yield { rowCount: n, columns: { generation: new Int32Array(n).fill(g), row } };
    }
  }
  await writeDataFile(join(dir, "rows.csv"), "csv", columns, batches());
  process.stdout.write(`done rows.csv ${g}\n`);

  const rejects = await RejectsWriter.open(join(dir, "rejects.ndjson"));
  for (let s = 0; s < REJECT_ROWS; s += 10_000) {
    const records = [];
    for (let r = s; r < s + 10_000; r++) {
      records.push({
        file: `day-${g}.csv`,
        row: r + 1,
        column: null,
        code: "ragged_row",
        reason: "test",
        raw: "x".repeat(40),
      });
    }
    await rejects.write(records);
  }
  await rejects.commit();
  process.stdout.write(`done rejects.ndjson ${g}\n`);
}
