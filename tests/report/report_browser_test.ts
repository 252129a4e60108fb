/**
 * The report in a real browser: headless Chromium (Debian's `chromium` package) opens the
 * file from disk, must log nothing to its console (scripts that fail, requests the
 * content policy refused and any other message all show up there), and its screenshot
 * must show a page, not a blank. Skipped, and counted as ignored, when Chromium is not
 * installed: `apt-get install -y chromium`.
 *
 * The console is read from Chromium's own log on stderr (`--enable-logging=stderr`), not
 * through the DevTools protocol: that needs a WebSocket, so network permission for the
 * tests, and this way needs none.
 */
import { Buffer } from "node:buffer";
import { PNG } from "pngjs";
import { assert, assertEquals } from "../_assert.ts";
import { renderFixture } from "./_fixture.ts";

const CHROMIUM = findChromium();
if (!CHROMIUM) {
  console.warn(
    "report_browser_test: Chromium is not installed, so the browser tests are ignored " +
      "(install it with `apt-get install -y chromium`, or set LONGTAIL_CHROMIUM to its path).",
  );
}

function findChromium(): string | undefined {
  const named = Deno.env.get("LONGTAIL_CHROMIUM");
  const candidates = named ? [named] : [];
  for (const folder of (Deno.env.get("PATH") ?? "").split(":").filter(Boolean)) {
    for (const name of ["chromium", "chromium-browser"]) candidates.push(`${folder}/${name}`);
  }
  return candidates.find((path) => {
    try {
      return Deno.statSync(path).isFile;
    } catch {
      return false;
    }
  });
}

interface BrowserRun {
  /** Console lines Chromium logged while the page loaded. */
  console: string[];
  /** The file Chromium wrote (screenshot or PDF). */
  file: Uint8Array;
}

/** Opens a file in a fresh headless Chromium and captures a screenshot or a PDF. */
async function openInChromium(htmlPath: string, mode: "screenshot" | "pdf"): Promise<BrowserRun> {
  const folder = await Deno.makeTempDir({ prefix: "longtail_chromium_" });
  const output = `${folder}/${mode === "pdf" ? "page.pdf" : "page.png"}`;
  try {
    const command = new Deno.Command(CHROMIUM!, {
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        `--user-data-dir=${folder}/profile`,
        "--enable-logging=stderr",
        "--v=0",
        "--window-size=1200,1600",
        "--hide-scrollbars",
        mode === "pdf" ? `--print-to-pdf=${output}` : `--screenshot=${output}`,
        "--no-pdf-header-footer",
        `file://${htmlPath}`,
      ],
      stdout: "null",
      stderr: "piped",
    });
    const child = command.spawn();
    const timer = setTimeout(() => child.kill("SIGKILL"), 90_000);
    const { stderr, success } = await child.output();
    clearTimeout(timer);
    const log = new TextDecoder().decode(stderr);
    assert.ok(success, `chromium exited with an error:\n${log.slice(-2000)}`);
    return {
      console: log.split("\n").filter((line) => /:CONSOLE[:(]/.test(line)),
      file: await Deno.readFile(output),
    };
  } finally {
    await Deno.remove(folder, { recursive: true });
  }
}

/** How much of a picture is not background: distinct colours and the share of "ink". */
function inkOf(
  png: Uint8Array,
): { width: number; height: number; colours: number; inkShare: number } {
  const image = PNG.sync.read(Buffer.from(png));
  const colours = new Set<number>();
  const background = image.data.readUInt32BE(0);
  let ink = 0;
  for (let i = 0; i < image.data.length; i += 4) {
    const pixel = image.data.readUInt32BE(i);
    colours.add(pixel);
    if (pixel !== background) ink++;
  }
  return {
    width: image.width,
    height: image.height,
    colours: colours.size,
    inkShare: ink / (image.width * image.height),
  };
}

async function writeTemporary(html: string): Promise<string> {
  const path = await Deno.makeTempFile({ prefix: "longtail_report_", suffix: ".html" });
  await Deno.writeTextFile(path, html);
  return path;
}

Deno.test({
  name: "the browser check sees console errors and blank pages (so the report tests can fail)",
  ignore: !CHROMIUM,
  fn: async () => {
    const page = await writeTemporary(
      `<!DOCTYPE html><html><head><meta http-equiv="Content-Security-Policy" content="default-src 'none'; ` +
        `script-src 'unsafe-inline'"></head><body style="background:#fff"><img src="blocked.png">` +
        `<script>console.error("canary")</script></body></html>`,
    );
    try {
      const run = await openInChromium(page, "screenshot");
      assert.ok(run.console.some((line) => line.includes("canary")), run.console.join("\n"));
      assert.ok(
        run.console.some((line) => line.includes("Content Security Policy")),
        "a refused request is logged",
      );
      const ink = inkOf(run.file);
      assert.ok(ink.inkShare < 0.001, `a blank page has no ink (${ink.inkShare})`);
    } finally {
      await Deno.remove(page);
    }
  },
});

for (const name of ["bias_review.md", "hostile.md"]) {
  Deno.test({
    name: `Chromium opens the report of ${name} from disk with a silent console and draws a page`,
    ignore: !CHROMIUM,
    fn: async () => {
      const { html } = await renderFixture(name);
      const page = await writeTemporary(html);
      try {
        const run = await openInChromium(page, "screenshot");
        assertEquals(run.console, [], "nothing on the console: no error, no refused request");
        const ink = inkOf(run.file);
        assertEquals([ink.width, ink.height], [1200, 1600]);
        // A page of text, tables and verdict colours has hundreds of colours once anti-aliased;
        // common practice, no source: a blank or error page has a handful.
        assert.ok(ink.colours > 100, `distinct colours: ${ink.colours}`);
        assert.ok(ink.inkShare > 0.02, `share of non-background pixels: ${ink.inkShare}`);
      } finally {
        await Deno.remove(page);
      }
    },
  });
}

Deno.test({
  name: "Chromium prints the report to a PDF with a silent console",
  ignore: !CHROMIUM,
  fn: async () => {
    const { html } = await renderFixture("bias_review.md");
    const page = await writeTemporary(html);
    try {
      const run = await openInChromium(page, "pdf");
      assertEquals(run.console, []);
      const text = new TextDecoder("latin1").decode(run.file);
      assert.ok(text.startsWith("%PDF-"));
      const pages = text.match(/\/Type\s*\/Page[^s]/g)?.length ?? 0;
      assert.ok(pages >= 2, `pages: ${pages}`);
    } finally {
      await Deno.remove(page);
    }
  },
});
