/*
 * Squarewright embed helper, for a publisher's own page. Paste the snippet from the editor's
 * Readers page: an <iframe> of a /embed/ address and this script. The framed page reports its
 * height; this script sets the frame's height to match, so the puzzle never scrolls inside a
 * box. It reads nothing from the page or the reader.
 */
(function () {
  'use strict';
  window.addEventListener('message', function (event) {
    var data = event.data;
    if (!data || data.type !== 'squarewright:height' || typeof data.height !== 'number') return;
    var frames = document.querySelectorAll('iframe[data-squarewright]');
    for (var i = 0; i < frames.length; i++) {
      var frame = frames[i];
      if (frame.contentWindow !== event.source) continue;
      if (new URL(frame.src, window.location.href).origin !== event.origin) continue;
      frame.style.height = Math.max(120, Math.min(20000, Math.ceil(data.height))) + 'px';
    }
  });
})();
