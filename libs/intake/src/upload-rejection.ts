/** A file or mapping Loadwright refuses as a whole: nothing is stored, and `message` names the row and column. */
export class UploadRejection extends Error {
  override readonly name = 'UploadRejection';
}
