/** Whether a form's errors already hold a message at `path` ("items.2.text"). */
export function problemAt(errors: object, path: string): boolean {
  let node: unknown = errors;
  for (const part of path.split(".")) {
    if (node === null || typeof node !== "object") return false;
    node = (node as Record<string, unknown>)[part];
  }
  return node !== undefined;
}
