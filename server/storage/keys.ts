const KEY = /^[a-f0-9]{64}-[a-z]{2,12}\.(jpg|png)$/;

/** True for a key this project produces; anything else never reaches a file system or bucket. */
export function isValidKey(key: string): boolean {
  return KEY.test(key);
}
