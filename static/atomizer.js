// fogbench: the atomizer inputs show only the chosen family's group and its
// correlations. Without this file every group is shown and the server still
// reads only the chosen family's inputs.
(function () {
  "use strict";
  function sync(root) {
    var fam = root.querySelector("select[data-family-select]");
    if (!fam) { return; }
    var groups = root.querySelectorAll(".family-group[data-family]");
    for (var i = 0; i < groups.length; i++) {
      groups[i].hidden = groups[i].getAttribute("data-family") !== fam.value;
    }
    var corr = root.querySelector("select[data-correlation-select]");
    if (!corr) { return; }
    var opt = corr.querySelectorAll("optgroup[data-family]");
    for (var j = 0; j < opt.length; j++) {
      var mine = opt[j].getAttribute("data-family") === fam.value;
      opt[j].hidden = !mine;
      opt[j].disabled = !mine;
    }
    var sel = corr.options[corr.selectedIndex];
    if (sel && sel.parentNode && sel.parentNode.disabled) { corr.value = ""; }
  }
  document.addEventListener("DOMContentLoaded", function () {
    var roots = document.querySelectorAll(".atomizer-fields");
    for (var i = 0; i < roots.length; i++) {
      (function (root) {
        sync(root);
        root.addEventListener("change", function (e) {
          if (e.target && e.target.hasAttribute("data-family-select")) { sync(root); }
        });
      })(roots[i]);
    }
  });
})();
