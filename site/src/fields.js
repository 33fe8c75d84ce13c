// @ts-check
// fields.js: messages beside the fields they are about. Each field's message box is the element
// with the field's id and "-error"; the field is marked aria-invalid while it shows one.

import { $ } from "./dom.js";
import { fieldText } from "./messages.js";

/**
 * @typedef {object} Problem  an input the page cannot use, and why
 * @property {Element | null} input  the field to mark; null: the message belongs to no field
 * @property {string} message
 */

/** @param {Element} input */
const errorBox = (input) => document.getElementById(input.id + "-error");

/**
 * setFieldError shows message beside input and marks it invalid.
 * @param {Element} input
 * @param {string} message
 */
export function setFieldError(input, message) {
  input.setAttribute("aria-invalid", "true");
  const box = errorBox(input);
  if (box) { box.textContent = fieldText(message); box.hidden = false; }
}

/**
 * clearFieldError takes the message beside input away.
 * @param {Element} input
 */
export function clearFieldError(input) {
  input.removeAttribute("aria-invalid");
  const box = errorBox(input);
  if (box) { box.textContent = ""; box.hidden = true; }
}

/**
 * showGeneralError shows a message that belongs to no field, in the project bar.
 * @param {string} message
 */
export function showGeneralError(message) {
  const box = $("#import-error");
  box.textContent = message;
  box.hidden = false;
}
