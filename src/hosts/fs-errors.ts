// What a failed file-system call means, in words, for messages to the person at the command
// line: the path, what was being done, why it failed, and Node's code in brackets.

/** Node's error codes of the file system, as a person would say them. */
const REASONS: Readonly<Record<string, string>> = {
  ENOENT: 'no such file or folder',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  EISDIR: 'it is a folder, not a file',
  ENOTDIR: 'a part of the path is a file, not a folder',
  EEXIST: 'something of that name is already there',
  ENOTEMPTY: 'the folder is not empty',
  EROFS: 'the file system is read-only',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'the disk quota is used up',
  EMFILE: 'too many files are open',
  ENFILE: 'too many files are open on the system',
  ENAMETOOLONG: 'the name is too long',
  ELOOP: 'too many symbolic links in the path',
  EBUSY: 'the file is busy',
  EXDEV: 'the temporary file is on another device',
  EINVAL: 'the name is not valid here',
  EIO: 'an input/output error of the device',
  EFBIG: 'the file is too large',
  ETXTBSY: 'the file is in use',
  EAGAIN: 'the file is temporarily unavailable',
};

/** What was being done, by the failed system call. */
const DOING: Readonly<Record<string, string>> = {
  open: 'cannot open',
  read: 'cannot read',
  write: 'cannot write',
  mkdir: 'cannot create the folder',
  rename: 'cannot move into place',
  stat: 'cannot look at',
  lstat: 'cannot look at',
  scandir: 'cannot list',
  unlink: 'cannot remove',
  realpath: 'cannot resolve',
};

interface SystemError {
  readonly code: string;
  readonly syscall?: string;
  readonly path?: string;
}

/** Whether a thrown value is one of Node's file-system errors (it has a code we can word). */
export function isFileSystemError(e: unknown): e is SystemError {
  return typeof e === 'object' && e !== null && typeof (e as { code?: unknown }).code === 'string' && REASONS[(e as SystemError).code] !== undefined;
}

/** The reason alone: "permission denied (EACCES)"; other errors give their message. */
export function fileSystemReason(e: unknown): string {
  // mkdir -p over a file says EEXIST: the file is what stands in the way.
  if (isFileSystemError(e) && e.code === 'EEXIST' && e.syscall === 'mkdir') return `a file of that name is in the way (EEXIST)`;
  if (isFileSystemError(e)) return `${REASONS[e.code]} (${e.code})`;
  return e instanceof Error ? e.message : String(e);
}

/**
 * One line for a failed file-system call: "cannot create the folder out/x: a part of the
 * path is a file, not a folder (ENOTDIR)". `path` is the one the user gave, when known
 * (Node's error carries the resolved one).
 */
export function fileSystemErrorText(e: unknown, path?: string): string {
  const where = path ?? (isFileSystemError(e) ? e.path : undefined);
  const doing = isFileSystemError(e) && e.syscall ? DOING[e.syscall] : undefined;
  const subject = where === undefined ? '' : doing ? `${doing} ${where}: ` : `${where}: `;
  return `${subject}${fileSystemReason(e)}`;
}
