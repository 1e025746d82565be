/** A problem with the uploaded file itself: the message names the file, and the row or column. */
export class FileProblem extends Error {
  constructor(
    message: string,
    /** 413 for a file over the size limit, 400 otherwise. */
    readonly status = 400,
    readonly field = 'file',
  ) {
    super(message);
    this.name = 'FileProblem';
  }
}
