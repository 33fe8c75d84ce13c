// @ts-check
// undo.js: the one way the page offers to take back a removal or a replacement ("Undo", "Bring
// it back"). An Undo owns an element that is shown while there is something to bring back (a
// notice bar with its text and button, or the button alone) and the button that brings it back.
//
//   const undo = createUndo({ shown: $("#bench-undo-bar"), text: $("#bench-undo-text"), button: $("#bench-undo") });
//   undo.offer("Row 3 deleted.", () => restore(before));

/**
 * @typedef {object} Undo
 * @property {(message: string, restore: () => void) => void} offer  show the offer; the button runs restore once
 * @property {() => void} drop  withdraw the offer (a newer state makes it meaningless)
 */

/**
 * createUndo wires the button of one place that offers an undo.
 * @param {{shown: HTMLElement, text?: HTMLElement, button: HTMLElement}} els
 * @returns {Undo}
 */
export function createUndo({ shown, text, button }) {
  /** @type {(() => void) | null} */
  let restore = null;
  button.addEventListener("click", () => {
    const r = restore;
    restore = null;
    shown.hidden = true;
    if (r) r();
  });
  return {
    offer(message, fn) {
      restore = fn;
      if (text) text.textContent = message;
      shown.hidden = false;
    },
    drop() {
      restore = null;
      shown.hidden = true;
    },
  };
}
