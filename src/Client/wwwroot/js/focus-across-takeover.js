// The start page arrives rendered by the server; about two seconds later the client takes it over and draws it again,
// with new elements in place of the old. Without this, a keyboard user who had tabbed to a link by then would find the
// focus back at the top of the page. The client draws the same elements in the same order, so the element at the same
// place among the focusable ones is the one that had the focus.
(() => {
  const focusable = 'a[href], button, input, select, textarea, summary, [tabindex]';
  let focused = null;
  let place = -1;
  document.addEventListener('focusin', event => {
    focused = event.target;
    place = [...document.querySelectorAll(focusable)].indexOf(focused);
  });
  const observer = new MutationObserver(() => {
    if (focused === null || focused.isConnected || place < 0) {
      return;
    }
    const replacement = document.querySelectorAll(focusable)[place];
    if (replacement && (document.activeElement === null || document.activeElement === document.body)) {
      replacement.focus({ preventScroll: true });
      focused = replacement;
    }
  });
  observer.observe(document, { childList: true, subtree: true });
  // The takeover happens once; after it the client's own focus handling is in charge.
  setTimeout(() => observer.disconnect(), 60000);
})();
