// A fault in a file being read, at a line: thrown inside the readers, turned into an error
// value (with the file name) at their entry points. Exceptions of any other class are bugs.
export class LineError {
  constructor(
    readonly line: number,
    readonly message: string,
  ) {}
}
