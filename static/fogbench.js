// fogbench: progressive enhancement only. The forms work without this file;
// with it, the case form shows only the fields of the chosen size model, the
// units switch applies at once, and a file import shows progress and can be
// cancelled.
(function () {
  "use strict";
  function showModelGroups(form) {
    var sel = form.querySelector("select[name=model]");
    if (!sel) { return; }
    var groups = form.querySelectorAll(".model-group");
    for (var i = 0; i < groups.length; i++) {
      var models = (groups[i].getAttribute("data-model") || "").split(" ");
      groups[i].hidden = models.indexOf(sel.value) < 0;
    }
  }
  // initCaseForm wires a case form; it runs again when htmx swaps in a new
  // one (after applying imported classes or a fit).
  function initCaseForm() {
    var form = document.getElementById("case-form");
    if (!form || form.getAttribute("data-wired") === "1") { return; }
    form.setAttribute("data-wired", "1");
    showModelGroups(form);
    form.addEventListener("change", function (e) {
      if (e.target && e.target.name === "model") { showModelGroups(form); }
    });
  }
  document.addEventListener("DOMContentLoaded", initCaseForm);
  document.addEventListener("htmx:afterSettle", initCaseForm);

  // The units switch applies as soon as a system is chosen; its button stays
  // for keyboards and for pages without this script.
  document.addEventListener("change", function (e) {
    var t = e.target;
    if (t && t.hasAttribute && t.hasAttribute("data-autosubmit") && t.form) {
      if (t.form.requestSubmit) { t.form.requestSubmit(); } else { t.form.submit(); }
    }
  });

  // The measured-data import: refuse a file over the limit before sending
  // it, show the upload progress, and let the user cancel.
  var importButton = null;
  function importError(msg) {
    var p = document.getElementById("e-import-file");
    var input = document.getElementById("f-import-file");
    if (!p || !input) { return; }
    p.textContent = msg;
    p.hidden = msg === "";
    if (msg === "") { input.removeAttribute("aria-invalid"); } else { input.setAttribute("aria-invalid", "true"); }
  }
  document.addEventListener("htmx:beforeRequest", function (e) {
    var elt = e.detail && e.detail.elt;
    if (!elt || elt.getAttribute("hx-post") !== "/cases/import-preview") { return; }
    if (elt.value === "preview") {
      var input = document.getElementById("f-import-file");
      var limit = input ? parseInt(input.getAttribute("data-max-bytes"), 10) : 0;
      if (!input || !input.files || input.files.length === 0) {
        importError("Choose a CSV file first.");
        e.preventDefault();
        return;
      }
      if (limit > 0 && input.files[0].size > limit) {
        importError("The file is larger than the limit of 8 MiB. Nothing was imported; split the file or bin the drops first.");
        e.preventDefault();
        return;
      }
      importError("");
    }
    importButton = elt;
    var bar = document.getElementById("import-progress");
    if (bar) { bar.removeAttribute("value"); }
    var status = document.getElementById("import-status");
    if (status) { status.textContent = "Sending the file…"; }
  });
  document.addEventListener("htmx:xhr:progress", function (e) {
    if (e.detail.elt !== importButton || !e.detail.lengthComputable) { return; }
    var bar = document.getElementById("import-progress");
    var status = document.getElementById("import-status");
    var pct = Math.round(100 * e.detail.loaded / e.detail.total);
    if (bar) { bar.value = pct; }
    if (status) { status.textContent = pct < 100 ? "Sending the file… " + pct + " %" : "Reading the file…"; }
  });
  document.addEventListener("htmx:afterRequest", function (e) {
    if (e.detail.elt === importButton) { importButton = null; }
  });
  document.addEventListener("htmx:abort", function (e) {
    if (e.target === importButton) {
      var status = document.getElementById("import-status");
      if (status) { status.textContent = "Cancelled."; }
    }
  });
  document.addEventListener("click", function (e) {
    var t = e.target;
    if (t && t.getAttribute && t.getAttribute("data-action") === "cancel-import" && importButton && window.htmx) {
      window.htmx.trigger(importButton, "htmx:abort");
      importError("Import cancelled; nothing was imported.");
    }
  });
})();
