// Starts Headroom. A file of its own (not an inline script) so the
// Content-Security-Policy can forbid inline scripts. scripts/post-build
// writes the hashed module names in place of the two markers.
import init from "./__HEADROOM_JS__";

init({ module_or_path: "./__HEADROOM_WASM__" });

// Offline: a service worker keeps every file of this version. When a newer
// version has been installed, offer to switch; the page keeps running on
// the version it loaded until the person says so, so files never mix.
if ("serviceWorker" in navigator) {
  let asked = false;
  const offer = (worker) => {
    if (!worker || document.getElementById("update-offer")) return;
    const bar = document.createElement("div");
    bar.id = "update-offer";
    bar.setAttribute("role", "status");
    bar.setAttribute("data-testid", "update-offer");
    const text = document.createElement("span");
    text.textContent = "A newer version of Headroom is ready. Your work is saved.";
    const button = document.createElement("button");
    button.type = "button";
    button.textContent = "Switch to it";
    button.addEventListener("click", () => {
      asked = true;
      worker.postMessage("take-over");
    });
    bar.append(text, button);
    document.body.append(bar);
  };
  navigator.serviceWorker.addEventListener("controllerchange", () => {
    if (asked) location.reload();
  });
  navigator.serviceWorker.register("./sw.js").then((reg) => {
    if (reg.waiting && navigator.serviceWorker.controller) offer(reg.waiting);
    reg.addEventListener("updatefound", () => {
      const worker = reg.installing;
      if (!worker) return;
      worker.addEventListener("statechange", () => {
        if (worker.state === "installed" && navigator.serviceWorker.controller) offer(worker);
      });
    });
  }).catch((e) => console.warn("Headroom: offline use is not available here:", e.message));
}
