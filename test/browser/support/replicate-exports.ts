// The invented demo exports, sent for the sample the journey received at intake.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ARTIFACTS, ROOT } from './stack';

const DEMO_FILES = join(ROOT, 'docker-free-scripts', 'seed', 'demo-files');

/** The seeded Ridgeline Red sample whose exports read "consistent", and its bad copy (line 9). */
const SOURCE_SAMPLE = 'OP-7K3M-Q9';
const SOURCE_FILES = ['ridgeline-red_rep1.csv', 'broken-line-9.csv', 'ridgeline-red_rep2.csv', 'ridgeline-red_rep3.csv'];

/**
 * The seed ships exports only for samples it has already accepted, while the journey receives a
 * sample that is still awaiting arrival. The same invented readings (a Ridgeline Red that matches
 * its library) are written under the received sample's code, in file name and header line, so the
 * replicate table and the report name the sample they belong to. Returns the paths in upload order.
 */
export function exportsFor(sampleCode: string): { paths: string[]; broken: string } {
  const folder = join(ARTIFACTS, 'uploads');
  mkdirSync(folder, { recursive: true });
  const paths = SOURCE_FILES.map((name) => {
    const text = readFileSync(join(DEMO_FILES, `${SOURCE_SAMPLE}_${name}`), 'utf8').replaceAll(SOURCE_SAMPLE, sampleCode);
    const path = join(folder, `${sampleCode}_${name}`);
    writeFileSync(path, text);
    return path;
  });
  return { paths, broken: `${sampleCode}_broken-line-9.csv` };
}
