// fogbench: progressive enhancement only. The forms work without this file;
// with it, the case form shows only the fields of the chosen size model.
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
  document.addEventListener("DOMContentLoaded", function () {
    var form = document.getElementById("case-form");
    if (!form) { return; }
    showModelGroups(form);
    form.addEventListener("change", function (e) {
      if (e.target && e.target.name === "model") { showModelGroups(form); }
    });
  });
})();
