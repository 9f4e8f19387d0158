// Wirewalk: apply the saved display mode ("bench" light or "bay" dark) before
// the first paint. Kept in step with src/lib/mode.ts (same key, same values).
(function () {
  var mode = 'bench';
  try {
    var saved = window.localStorage.getItem('wirewalk.mode');
    if (saved === 'bench' || saved === 'bay') mode = saved;
    else if (window.matchMedia && window.matchMedia('(prefers-color-scheme: dark)').matches) mode = 'bay';
  } catch {
    /* storage blocked: keep bench */
  }
  document.documentElement.setAttribute('data-mode', mode);
})();
