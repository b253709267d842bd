// Starts Headroom. A file of its own (not an inline script) so the
// Content-Security-Policy can forbid inline scripts. scripts/post-build
// writes the hashed module names and this build's id in place of the
// markers.
import init from "./__HEADROOM_JS__";

// This build: its time (UTC) then the module's name, so a later build
// sorts after an earlier one. An open tab compares it with the build
// other tabs start (see src/ui/keep.rs) and stops saving if it is older.
window.headroomBuild = "__HEADROOM_BUILD__";

// If the module cannot start (an old browser, a damaged download, no
// WebAssembly), say so plainly instead of leaving a blank page.
function cannotStart(error) {
  console.error("Headroom could not start:", error);
  if (document.getElementById("cannot-start")) return;
  document.getElementById("loading")?.remove();
  const box = document.createElement("div");
  box.id = "cannot-start";
  box.setAttribute("role", "alert");
  box.setAttribute("data-testid", "cannot-start");
  const title = document.createElement("h1");
  title.textContent = "Headroom could not start";
  const text = document.createElement("p");
  text.textContent = "This browser could not load the worksheet program. Worksheets already saved on this device are not affected. Reload to try again; if it keeps happening, use an up-to-date browser.";
  const detail = document.createElement("p");
  detail.className = "detail";
  detail.textContent = String(error && error.message ? error.message : error);
  const button = document.createElement("button");
  button.type = "button";
  button.textContent = "Reload";
  button.addEventListener("click", () => location.reload());
  box.append(title, text, detail, button);
  document.body.append(box);
}

let started;
try {
  started = init({ module_or_path: "./__HEADROOM_WASM__" }).catch(cannotStart);
} catch (e) {
  cannotStart(e);
  started = Promise.resolve();
}

// Offline: a service worker keeps every file of this version. When a newer
// version has been installed, offer to switch; the page keeps running on
// the version it loaded until the person says so, so files never mix.
// It is registered once the page has started and painted its first frame:
// on a first visit its install fetches every file again, which should not
// compete with the page's own start (common practice).
function registerWorker() {
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
  // Every file is cached once a worker is active: tell the page.
  navigator.serviceWorker.ready.then(() => {
    window.headroomOffline = true;
    window.dispatchEvent(new Event("headroom-offline-ready"));
  });
}

if ("serviceWorker" in navigator) {
  // A page opened in a background tab paints no frames until it is shown:
  // a timer registers the worker there.
  let registered = false;
  const registerOnce = () => {
    if (registered) return;
    registered = true;
    registerWorker();
  };
  started.then(() => {
    requestAnimationFrame(() => setTimeout(registerOnce, 0));
    setTimeout(registerOnce, 3000);
  });
}
