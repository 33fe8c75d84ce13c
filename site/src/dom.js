// @ts-check
// dom.js: the page's elements, found by selector and checked for their type, and the few DOM
// helpers every module uses. Every text from the user, a file or the module reaches the page
// through textContent, never innerHTML.

import { capital, sentence } from "./format.js";

/** @typedef {HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement} Field  a form control with a value */

/**
 * $ returns the element sel names. A missing element is a broken page, not bad input: it throws.
 * @param {string} sel
 * @returns {HTMLElement}
 */
export function $(sel) {
  const e = document.querySelector(sel);
  if (!(e instanceof HTMLElement)) throw new Error(`copoly: the page has no element ${sel}`);
  return e;
}

/**
 * $as returns the element sel names, checked to be of the given type.
 * @template {Element} T
 * @param {string} sel
 * @param {{new (): T, prototype: T}} type
 * @returns {T}
 */
export function $as(sel, type) {
  const e = document.querySelector(sel);
  if (!(e instanceof type)) throw new Error(`copoly: the page has no ${type.name} ${sel}`);
  return e;
}

/**
 * field returns the form control sel names: an input, a text area or a select.
 * @param {string} sel
 * @returns {Field}
 */
export function field(sel) {
  const e = document.querySelector(sel);
  if (e instanceof HTMLInputElement || e instanceof HTMLTextAreaElement || e instanceof HTMLSelectElement) return e;
  throw new Error(`copoly: the page has no form control ${sel}`);
}

/** input returns the <input> sel names. @param {string} sel */
export const input = (sel) => $as(sel, HTMLInputElement);
/** select returns the <select> sel names. @param {string} sel */
export const select = (sel) => $as(sel, HTMLSelectElement);

/**
 * choice returns the value of the <select> sel names, one of allowed (its options' values).
 * @template {string} T
 * @param {string} sel
 * @param {readonly T[]} allowed
 * @returns {T}
 */
export function choice(sel, allowed) {
  const v = select(sel).value;
  const c = allowed.find((a) => a === v);
  if (c === undefined) throw new Error(`copoly: ${sel} holds ${JSON.stringify(v)}, not one of its options`);
  return c;
}

/**
 * setText sets the text of an element (or of the element sel names).
 * @param {string | Element} sel
 * @param {string} text
 */
export function setText(sel, text) {
  const e = typeof sel === "string" ? $(sel) : sel;
  e.textContent = text;
}

/**
 * button makes a button with a text and a click handler.
 * @param {string} text
 * @param {(ev: MouseEvent) => unknown} onClick
 * @returns {HTMLButtonElement}
 */
export function button(text, onClick) {
  const b = document.createElement("button");
  b.type = "button";
  b.textContent = text;
  b.addEventListener("click", onClick);
  return b;
}

/**
 * cell makes an element with a text: a table cell, a list item, a term.
 * @template {keyof HTMLElementTagNameMap} K
 * @param {K} tag
 * @param {string} text
 * @returns {HTMLElementTagNameMap[K]}
 */
export function cell(tag, text) {
  const e = document.createElement(tag);
  e.textContent = text;
  return e;
}

/**
 * fillList puts the messages into the list as items, each a sentence.
 * @param {Element} list
 * @param {string[]} messages
 */
export function fillList(list, messages) {
  list.replaceChildren(...messages.map((t) => cell("li", capital(sentence(t)))));
}

/**
 * factList fills a <dl> with [term, value] pairs, each pair in a <div>; key, when given for a
 * pair, becomes the value's data-key.
 * @param {Element} dl
 * @param {[string, string, string?][]} facts
 */
export function factList(dl, facts) {
  dl.replaceChildren(...facts.map(([label, value, key]) => {
    const div = document.createElement("div");
    const dd = cell("dd", value);
    if (key) dd.dataset.key = key;
    div.append(cell("dt", label), dd);
    return div;
  }));
}
