// The file host on Node (SheetJS in a child process) and the words for file-system errors: an
// entry apart from index.ts, so that the page's bundles never import a node: module.
export { FileHost, openFile, sameFile, writeOutputFile } from './file-host.js';
export { fileSystemErrorText, fileSystemReason, isFileSystemError } from './fs-errors.js';
