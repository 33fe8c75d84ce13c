// @ts-check
// store.js: the page's state, by name, with subscriptions.
//
// The modules share no mutable object: what more than one of them needs (the project in use,
// whether the form is valid, the converted bench runs, the last fit…; see state.js) is kept here
// under a name. A module reads it with get, replaces it with set (never changes it in place) and
// hears of every set through subscribe. set takes an optional reason, passed to the subscribers,
// which tells them what changed (for the project: "form", "load", "bench"…).

/**
 * @template {object} S  the named state: name → type of its value
 */
export class Store {
  /** @param {S} initial */
  constructor(initial) {
    /** @type {S} */
    this.values = { ...initial };
    /**
     * The subscribers of each name. Each set holds functions of that name's value only (see
     * subscribe); the map's type cannot say so, hence the cast in set.
     * @type {Map<keyof S, Set<(value: never, why: string) => void>>}
     */
    this.subscribers = new Map();
  }

  /**
   * get returns the value of name.
   * @template {keyof S} K
   * @param {K} name
   * @returns {S[K]}
   */
  get(name) {
    return this.values[name];
  }

  /**
   * set replaces the value of name and tells its subscribers, in the order they subscribed.
   * @template {keyof S} K
   * @param {K} name
   * @param {S[K]} value
   * @param {string} [why] what changed, for the subscribers
   */
  set(name, value, why = "") {
    this.values[name] = value;
    for (const fn of [...(this.subscribers.get(name) || [])]) (/** @type {(value: S[K], why: string) => void} */ (fn))(value, why);
  }

  /**
   * subscribe calls fn after every set of name; it returns the function that ends that.
   * @template {keyof S} K
   * @param {K} name
   * @param {(value: S[K], why: string) => void} fn
   * @returns {() => void}
   */
  subscribe(name, fn) {
    let subs = this.subscribers.get(name);
    if (!subs) this.subscribers.set(name, (subs = new Set()));
    subs.add(fn);
    return () => { subs.delete(fn); };
  }
}
