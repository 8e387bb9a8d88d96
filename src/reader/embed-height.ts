// Inside an <iframe> on a publisher's site (the /embed/ pages): tell the parent page how tall
// this page is, whenever that changes, so public/embed/frame.js can size the frame to fit.
// Only a height and this page's path leave the frame; nothing about the reader.

export const HEIGHT_MESSAGE = 'squarewright:height';

export function postHeight(): void {
  if (window.parent === window) return;
  const height = Math.ceil(document.documentElement.getBoundingClientRect().height);
  window.parent.postMessage({ type: HEIGHT_MESSAGE, height, path: window.location.pathname }, '*');
}

export function watchHeight(): void {
  if (window.parent === window) return;
  postHeight();
  new ResizeObserver(() => postHeight()).observe(document.documentElement);
  window.addEventListener('load', postHeight);
}

watchHeight();
