/** Task pane entry inside Excel (shared runtime). */
const app = document.getElementById("app");
if (app) app.textContent = "Reshuffle";
