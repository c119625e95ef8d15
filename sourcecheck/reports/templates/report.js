// Filters: a check shows when its band is ticked and at least one of its reasons is;
// a claim shows while one of its checks does. No global names are left behind.
(function () {
  "use strict";
  var form = document.getElementById("filters");
  var counter = document.getElementById("shown-count");
  function ticked(name) {
    var values = {};
    form.querySelectorAll('input[name="' + name + '"]').forEach(function (box) {
      values[box.value] = box.checked;
    });
    return values;
  }
  function apply() {
    var bands = ticked("band");
    var reasons = ticked("reason");
    var shown = 0;
    document.querySelectorAll("article.claim").forEach(function (claim) {
      var any = false;
      claim.querySelectorAll("section.check").forEach(function (check) {
        var codes = check.getAttribute("data-reasons").split(" ");
        var visible = bands[check.getAttribute("data-band")] === true &&
          codes.some(function (code) { return reasons[code] !== false; });
        check.classList.toggle("hidden", !visible);
        if (visible) { shown += 1; any = true; }
      });
      claim.classList.toggle("hidden", !any);
    });
    counter.textContent = String(shown);
  }
  form.addEventListener("change", apply);
  apply();
})();
