// Loads office.js only when an Office host may be around: the manifest opens the pane with
// ?kiln-host=office, and Office itself passes _host_Info to the pane (web, Windows, Mac) and runs
// it in an iframe or a web view. It comes from Microsoft's CDN (the URL is this script tag's
// data-office-js attribute), the documented location. In a plain browser tab nothing is loaded,
// so nothing reaches the network. A file of its own, not an inline script, so that the page's
// Content-Security-Policy can say `script-src 'self'` (docs/content-security-policy.md).
// Leaves window.__kilnOffice = { hint, failed } for whenOfficeReady.ts.
(function () {
  var w = window;
  var me = document.currentScript;
  var src = me ? me.getAttribute("data-office-js") : null;
  var hint =
    /[?&#](_host_Info|kiln-host)=/i.test(w.location.search + w.location.hash) ||
    /_host_Info|hostInfoValue/i.test(w.name || "") ||
    w.parent !== w ||
    !!(w.chrome && w.chrome.webview) ||
    !!(w.webkit && w.webkit.messageHandlers) ||
    !!(w.external && "GetContext" in w.external);
  try {
    hint = hint || !!w.sessionStorage.getItem("hostInfoValue");
  } catch {
    // storage blocked: rely on the other hints
  }
  var state = { hint: hint, failed: false };
  w.__kilnOffice = state;
  if (!hint || !src) return;
  // A script that fails to load fires "error" on its element without bubbling: listen in the
  // capture phase rather than with an inline onerror attribute, which the policy forbids.
  w.addEventListener(
    "error",
    function (e) {
      if (e.target && e.target.src === src) state.failed = true;
    },
    true,
  );
  // Written while the page is parsed, so office.js runs before the pane's deferred script.
  document.write('<script src="' + src + '"></' + "script>");
})();
