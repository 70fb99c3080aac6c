// The report's Print button: the page carries no inline script (CSP).
document.addEventListener("DOMContentLoaded", function () {
  var b = document.querySelector(".print-button");
  if (b) {
    b.addEventListener("click", function () { window.print(); });
  }
});
