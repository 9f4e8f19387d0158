import { accessSync, constants } from 'node:fs';
import os from 'node:os';

/**
 * Where throw-away test data goes: WIREWALK_TEST_TMP, else /dev/shm when writable
 * (memory: DDL there is about ten times faster than on a virtual disk, and every test file
 * migrates a database of its own), else the OS temp folder.
 */
export function scratchDir(): string {
  if (process.env.WIREWALK_TEST_TMP) return process.env.WIREWALK_TEST_TMP;
  try {
    accessSync('/dev/shm', constants.W_OK);
    return '/dev/shm';
  } catch {
    return os.tmpdir();
  }
}
