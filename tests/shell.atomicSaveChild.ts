// Child process for tests/shell.atomicSave.test.ts: builds a large project's
// text, says "writing" on stdout, then saves it through the atomic saver and
// says "done". The test kills this process with SIGKILL at different moments.
import { writeFileAtomic } from '../electron/atomicWrite';
import { serializeProject } from '../shared/project/serializeProject';
import { exampleProject } from './project.exampleProject';

const [target, repeats, marker] = process.argv.slice(2);
const text = serializeProject(
  { ...exampleProject(Number(repeats)), notes: marker },
  new Date('2026-03-05T12:00:00.000Z'),
);
process.stdout.write(`writing ${text.length}\n`, () => {
  const started = performance.now();
  void writeFileAtomic(target, text).then(() => {
    process.stdout.write(`done ${Math.round(performance.now() - started)} ms\n`);
  });
});
