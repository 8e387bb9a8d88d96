// Sorting packed numeric keys in place: insertion sort for the short arrays of everyday
// tilings (no call into the engine's native sort), the native numeric sort otherwise.

export function sortKeys(keys: Float64Array): void {
  const n = keys.length;
  if (n > 48) {
    keys.sort();
    return;
  }
  for (let i = 1; i < n; i++) {
    const v = keys[i]!;
    let j = i - 1;
    while (j >= 0 && keys[j]! > v) {
      keys[j + 1] = keys[j]!;
      j--;
    }
    keys[j + 1] = v;
  }
}
