// @ts-check
// importer.js: the one way the page reads a file the user chooses (a project file, a bench
// table). The file input is emptied at once, so that choosing the same file again reads it again.

/**
 * onFileChosen reads each file chosen in input: on.start runs first (to clear an old message),
 * then on.read with the file's text, or on.fail with why it was not read (larger than maxBytes,
 * or the browser could not read it).
 * @param {HTMLInputElement} input
 * @param {number} maxBytes
 * @param {{start: () => void, read: (file: File, text: string) => unknown, fail: (file: File, why: "too-large" | "unreadable") => void}} on
 */
export function onFileChosen(input, maxBytes, on) {
  input.addEventListener("change", async () => {
    const file = input.files && input.files[0];
    input.value = "";
    on.start();
    if (!file) return;
    if (file.size > maxBytes) return on.fail(file, "too-large");
    let text;
    try {
      text = await file.text();
    } catch (e) {
      return on.fail(file, "unreadable");
    }
    await on.read(file, text);
  });
}
