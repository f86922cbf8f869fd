/**
 * `npm start`: builds the add-in, makes a self-signed certificate for localhost on
 * first run (openssl), serves dist/ on https://localhost:3000 and prints the preview
 * address and how to sideload the add-in into Excel.
 */
import { execFileSync, execSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { serveStatic } from "./static-server";

const PORT = Number(process.env.PORT ?? 3000);
const certDir = path.join(os.homedir(), ".reshuffle-dev-certs");
const keyFile = path.join(certDir, "localhost.key");
const certFile = path.join(certDir, "localhost.crt");

function ensureCertificate(): void {
  if (fs.existsSync(keyFile) && fs.existsSync(certFile)) return;
  fs.mkdirSync(certDir, { recursive: true });
  console.log(`Creating a self-signed certificate for localhost in ${certDir} …`);
  execFileSync("openssl", [
    "req", "-x509", "-newkey", "rsa:2048", "-nodes", "-sha256", "-days", "825",
    "-keyout", keyFile, "-out", certFile, "-subj", "/CN=localhost",
    "-addext", "subjectAltName=DNS:localhost,IP:127.0.0.1",
  ], { stdio: "pipe" });
}

async function main(): Promise<void> {
  if (!process.argv.includes("--no-build")) {
    console.log("Building the add-in (webpack, production) …");
    execSync("npx webpack --mode production", { stdio: "inherit" });
  }
  ensureCertificate();
  await serveStatic({ root: "dist", port: PORT, host: "localhost", tls: { key: fs.readFileSync(keyFile), cert: fs.readFileSync(certFile) } });
  const base = `https://localhost:${PORT}/`;
  console.log(`
Reshuffle is being served from dist/ at ${base}

  Preview (no Excel needed; built-in demo trial):  ${base}preview.html
  Manifest to sideload:                              ${path.resolve("dist/manifest.xml")}

The certificate is self-signed: open ${base}preview.html once in your browser and accept
it (or add ${certFile} to your trusted certificates) before sideloading.

Sideload into Excel
  Excel on the web:  open a workbook > Home > Add-ins > More add-ins > My add-ins >
                     Upload my add-in > choose dist/manifest.xml.
  Excel on Windows:  put dist/manifest.xml in a shared folder, add that folder under
                     File > Options > Trust Center > Trust Center Settings > Trusted Add-in
                     Catalogs (tick "Show in menu"), restart Excel, then Home > Add-ins >
                     Advanced > Shared folder > Reshuffle.
  Excel on Mac:      copy dist/manifest.xml to
                     ~/Library/Containers/com.microsoft.Excel/Data/Documents/wef/
                     (create the folder if needed), restart Excel, then Home > Add-ins.

Then press "Compare groups" on the Home tab, or type =RS. in a cell.
Press Ctrl+C to stop.`);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
