// Calls the tectomelt API from this page, with the access token when one is set.
// Other scripts on the page use: tectomelt.postJson("/v1/pressure", {depthsKm: [30]})
(function () {
  "use strict";
  var KEY = "tectomelt.token";

  function token() {
    try { return sessionStorage.getItem(KEY) || ""; } catch (e) { return ""; }
  }

  function headers(extra) {
    var h = Object.assign({"Accept": "application/json"}, extra || {});
    var t = token();
    if (t) { h["Authorization"] = "Bearer " + t; }
    return h;
  }

  // Resolves to {status, body} where body is the parsed JSON (a problem for 4xx/5xx).
  function call(method, path, body) {
    var init = {method: method, headers: headers(body === undefined ? {} : {"Content-Type": "application/json"})};
    if (body !== undefined) { init.body = JSON.stringify(body); }
    return fetch(path.replace(/^\//, ""), init).then(function (r) {
      return r.text().then(function (text) {
        return {status: r.status, body: text ? JSON.parse(text) : null, etag: r.headers.get("ETag")};
      });
    });
  }

  window.tectomelt = {
    getJson: function (path) { return call("GET", path); },
    postJson: function (path, body) { return call("POST", path, body); },
    hasToken: function () { return token() !== ""; }
  };

  var form = document.getElementById("token-form");
  if (!form) { return; }
  var input = document.getElementById("token");
  var status = document.getElementById("token-status");
  function show() { status.textContent = token() ? "a token is set for this tab" : "no token set"; }
  form.addEventListener("submit", function (ev) {
    ev.preventDefault();
    try { sessionStorage.setItem(KEY, input.value.trim()); } catch (e) { /* storage off */ }
    input.value = "";
    show();
  });
  document.getElementById("token-clear").addEventListener("click", function () {
    try { sessionStorage.removeItem(KEY); } catch (e) { /* storage off */ }
    show();
  });
  show();
})();
