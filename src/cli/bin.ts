/** Entry point of the `undertone` executable. */
import { describeFailure, quietOnClosedPipe } from './failure.js';
import { main } from './main.js';

quietOnClosedPipe(process.stdout);
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    const failure = describeFailure(process.argv[2] ?? '', err);
    process.stderr.write(`${failure.message}\n`);
    process.exitCode = failure.code;
  },
);
