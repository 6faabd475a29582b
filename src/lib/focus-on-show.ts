/**
 * A callback ref that moves focus to an element when it appears: for the first control of a part
 * the person has just opened (an inline "are you sure?"), so keyboard and screen-reader users land in
 * it. Never for something on the page as it loads; that is what the autofocus attribute gets wrong.
 */
export function focusOnShow(element: HTMLElement | null): void {
  element?.focus();
}
