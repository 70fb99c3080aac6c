// fogbench: progressive enhancement only. The forms work without this file;
// with it, the case form shows only the fields of the chosen size model, the
// units switch applies at once and keeps a case form's unsaved edits, and a
// file import shows progress and can be cancelled.
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

  // Switching units reloads the page. A case form with unsaved edits keeps
  // them: its fields are kept for this page in sessionStorage when the
  // switch is submitted and put back after the reload. Every number field
  // carries its own unit, which is kept with it, so the values mean what
  // the user entered in whichever system the page now shows.
  var unsavedKey = "fogbench:unsaved-case-form:";
  function markDirty(e) {
    var form = e.target && e.target.form;
    if (form && form.id === "case-form") { form.setAttribute("data-dirty", "1"); }
  }
  document.addEventListener("input", markDirty);
  document.addEventListener("change", markDirty);
  function keptFields(form) {
    var fields = [];
    for (var i = 0; i < form.elements.length; i++) {
      var el = form.elements[i];
      if (!el.name || el.type === "hidden" || el.type === "file" || el.type === "submit" || el.type === "button") { continue; }
      fields.push([el.name, el.type === "checkbox" || el.type === "radio" ? el.checked : el.value]);
    }
    return fields;
  }
  document.addEventListener("submit", function (e) {
    var form = document.getElementById("case-form");
    if (!e.target.classList.contains("units-form") || !form || form.getAttribute("data-dirty") !== "1") { return; }
    try {
      sessionStorage.setItem(unsavedKey + location.pathname + location.search, JSON.stringify(keptFields(form)));
    } catch (err) { /* storage off or full: the switch still applies */ }
  });
  function restoreUnsaved() {
    var key = unsavedKey + location.pathname + location.search;
    var raw = null;
    try { raw = sessionStorage.getItem(key); sessionStorage.removeItem(key); } catch (err) { return; }
    var form = document.getElementById("case-form");
    if (!raw || !form) { return; }
    var fields;
    try { fields = JSON.parse(raw); } catch (err) { return; }
    var seen = {};
    for (var i = 0; i < fields.length; i++) {
      var name = fields[i][0];
      var same = form.querySelectorAll("[name=\"" + CSS.escape(name) + "\"]");
      var el = same[seen[name] || 0];
      seen[name] = (seen[name] || 0) + 1;
      if (!el) { continue; }
      if (el.type === "checkbox" || el.type === "radio") { el.checked = fields[i][1] === true; } else { el.value = fields[i][1]; }
    }
    form.setAttribute("data-dirty", "1");
    showModelGroups(form);
    var note = document.createElement("p");
    note.className = "note";
    note.setAttribute("role", "status");
    note.setAttribute("data-testid", "unsaved-kept");
    note.textContent = "Your unsaved edits were kept across the unit switch; each value keeps the unit it was entered in. Blank fields and new pages use the new units.";
    form.insertBefore(note, form.firstChild);
    // The live results follow the restored fields.
    form.dispatchEvent(new Event("change", { bubbles: true }));
  }
  document.addEventListener("DOMContentLoaded", restoreUnsaved);

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
  // Bundle uploads (the import page, forms marked data-upload): refuse a
  // file over the limit before sending it, show how much of the upload has
  // gone, then that the server is checking it, and put the answer page in
  // place. Without this script the forms post as usual.
  function mib(n) { return (n / 1048576).toFixed(1) + " MiB"; }
  document.addEventListener("submit", function (e) {
    var form = e.target;
    if (e.defaultPrevented || !form.hasAttribute || !form.hasAttribute("data-upload") || !window.FormData || !window.DOMParser) { return; }
    var box = form.querySelector(".upload-progress");
    if (!box) { return; }
    var bar = box.querySelector("progress");
    var text = box.querySelector(".busy-text");
    var file = form.querySelector("input[type=file]");
    var limit = file ? parseInt(file.getAttribute("data-max-bytes"), 10) : 0;
    e.preventDefault();
    box.hidden = false;
    if (file && file.files && file.files.length > 0 && limit > 0 && file.files[0].size > limit) {
      bar.hidden = true;
      text.textContent = "The file is " + mib(file.files[0].size) + ", larger than the limit of " + file.getAttribute("data-max-text") + ". Nothing was imported.";
      return;
    }
    bar.hidden = false;
    bar.value = 0;
    text.textContent = "Sending…";
    var buttons = form.querySelectorAll("button[type=submit]");
    for (var i = 0; i < buttons.length; i++) { buttons[i].disabled = true; }
    var xhr = new XMLHttpRequest();
    xhr.open("POST", form.getAttribute("action"));
    xhr.upload.addEventListener("progress", function (ev) {
      if (!ev.lengthComputable || ev.total === 0) { return; }
      var pct = Math.floor(100 * ev.loaded / ev.total);
      bar.value = pct;
      text.textContent = "Sending… " + pct + " % of " + mib(ev.total);
    });
    xhr.upload.addEventListener("load", function () {
      bar.removeAttribute("value"); // indeterminate while the server works
      text.textContent = "Sent; checking every case…";
    });
    xhr.addEventListener("load", function () {
      var doc = new DOMParser().parseFromString(xhr.responseText, "text/html");
      document.title = doc.title;
      document.body.replaceWith(document.adoptNode(doc.body));
      window.scrollTo(0, 0);
      if (window.htmx) { window.htmx.process(document.body); }
    });
    xhr.addEventListener("error", function () {
      bar.hidden = true;
      text.textContent = "The upload failed: the connection to fogbench was lost. Nothing was imported.";
      for (var i = 0; i < buttons.length; i++) { buttons[i].disabled = false; }
    });
    xhr.send(new FormData(form));
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
