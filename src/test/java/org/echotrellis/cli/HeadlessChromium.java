package org.echotrellis.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.net.http.WebSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.echotrellis.io.Json;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.Assumptions;

/**
 * Headless Chromium (Debian package {@code chromium}) driven from tests through its DevTools
 * protocol over the JDK's WebSocket client: console errors, network requests, the rendered DOM,
 * screenshots and PDF printing, all in one browser start per session. Without the browser, tests are skipped outside
 * CI and fail in CI ({@code CI=true}).
 */
final class HeadlessChromium {
    private static final List<String> CANDIDATES = List.of("/usr/bin/chromium", "/usr/bin/chromium-browser",
            "/usr/bin/google-chrome");

    private final Path executable;
    private HeadlessChromium(Path executable) {
        this.executable = executable;
    }

    /**
     * @return the browser; skips the test when it is missing outside CI, fails in CI
     */
    static HeadlessChromium require() throws IOException {
        for (String c : CANDIDATES) {
            Path p = Path.of(c);
            if (Files.isExecutable(p)) {
                return new HeadlessChromium(p);
            }
        }
        String ci = System.getenv("CI");
        if (ci != null && !ci.isEmpty() && !ci.equalsIgnoreCase("false")) {
            Assertions.fail("CI: headless Chromium is required for the report checks but none of " + CANDIDATES
                    + " exists (.ci/run installs the Debian package chromium)");
        }
        Assumptions.abort("chromium is not installed; report browser checks skipped (they run in CI)");
        return null;
    }

    private List<String> base(Path profile) {
        return new ArrayList<>(List.of(executable.toString(), "--headless", "--no-sandbox", "--disable-gpu",
                "--no-first-run", "--no-default-browser-check", "--disable-extensions", "--hide-scrollbars",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--user-data-dir=" + profile));
    }

    /** What a page load showed through the DevTools protocol. */
    record Load(List<String> consoleErrors, List<String> requests, String text, String html) { }

    /**
     * Starts the browser on about:blank with remote debugging and attaches to its page.
     *
     * @return a session; close it to end the browser
     */
    Session start() throws Exception {
        // a profile of its own outside the test's directory (the browser leaves sockets there)
        Path profile = Files.createTempDirectory("echotrellis-chromium-");
        List<String> cmd = base(profile);
        cmd.addAll(List.of("--remote-debugging-port=0", "--remote-allow-origins=*", "about:blank"));
        Process proc = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        try {
            int port = port(proc);
            HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(10)).build();
            String ws = null;
            for (int attempt = 0; attempt < 100 && ws == null; attempt++) {
                String list = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/json/list")).build(),
                        HttpResponse.BodyHandlers.ofString()).body();
                for (JsonNode t : Json.MAPPER.readTree(list)) {
                    if (t.path("type").asText().equals("page")) {
                        ws = t.path("webSocketDebuggerUrl").asText();
                    }
                }
                if (ws == null) {
                    Thread.sleep(100);
                }
            }
            Assertions.assertNotNull(ws, "no page target in chromium");
            LinkedBlockingQueue<JsonNode> events = new LinkedBlockingQueue<>();
            WebSocket socket = http.newWebSocketBuilder().buildAsync(URI.create(ws), new Collector(events))
                    .get(30, TimeUnit.SECONDS);
            Session s = new Session(proc, socket, events, profile);
            for (String m : List.of("Runtime.enable", "Log.enable", "Network.enable", "Page.enable")) {
                s.call(m, null);
            }
            return s;
        } catch (Exception | AssertionError e) {
            proc.destroyForcibly();
            proc.waitFor(10, TimeUnit.SECONDS);
            deleteTree(profile);
            throw e;
        }
    }

    /** One browser with one page, driven through the DevTools protocol. */
    static final class Session implements AutoCloseable {
        private final Process proc;
        private final WebSocket socket;
        private final LinkedBlockingQueue<JsonNode> events;
        private final List<String> errors = new ArrayList<>();
        private final List<String> requests = new ArrayList<>();
        private boolean loaded;
        private int id;

        private final Path profile;

        private Session(Process proc, WebSocket socket, LinkedBlockingQueue<JsonNode> events, Path profile) {
            this.profile = profile;
            this.proc = proc;
            this.socket = socket;
            this.events = events;
        }

        /** Sends a command and waits for its result, collecting the events that arrive meanwhile. */
        JsonNode call(String method, ObjectNode params) throws InterruptedException {
            int my = ++id;
            ObjectNode m = Json.MAPPER.createObjectNode().put("id", my).put("method", method);
            if (params != null) {
                m.set("params", params);
            }
            socket.sendText(m.toString(), true).join();
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (System.nanoTime() < deadline) {
                JsonNode e = events.poll(200, TimeUnit.MILLISECONDS);
                if (e == null) {
                    continue;
                }
                if (e.path("id").asInt(-1) == my) {
                    Assertions.assertFalse(e.has("error"), method + ": " + e.path("error"));
                    return e.path("result");
                }
                loaded |= handle(e, errors, requests);
            }
            throw new AssertionError("no answer to " + method + " within 60 s");
        }

        /** Navigates to a page, waits for its load event and returns what the page showed. */
        Load load(Path html) throws InterruptedException, IOException {
            errors.clear();
            requests.clear();
            loaded = false;
            call("Page.navigate", Json.MAPPER.createObjectNode().put("url", html.toUri().toString()));
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (!loaded && System.nanoTime() < deadline) {
                JsonNode e = events.poll(200, TimeUnit.MILLISECONDS);
                if (e != null) {
                    loaded |= handle(e, errors, requests);
                }
            }
            Assertions.assertTrue(loaded, "the page did not fire its load event within 60 s");
            JsonNode r = call("Runtime.evaluate", Json.MAPPER.createObjectNode()
                    .put("expression", "JSON.stringify([document.body.innerText, document.documentElement.outerHTML])")
                    .put("returnByValue", true));
            JsonNode pair = Json.MAPPER.readTree(r.path("result").path("value").asText());
            JsonNode late;
            while ((late = events.poll(300, TimeUnit.MILLISECONDS)) != null) {
                handle(late, errors, requests);
            }
            return new Load(List.copyOf(errors), List.copyOf(requests), pair.get(0).asText(), pair.get(1).asText());
        }

        /** @return a PNG of the current page in a window of the given size (CSS pixels) */
        byte[] screenshot(int width, int height) throws InterruptedException {
            call("Emulation.setDeviceMetricsOverride", Json.MAPPER.createObjectNode().put("width", width)
                    .put("height", height).put("deviceScaleFactor", 1).put("mobile", false));
            JsonNode r = call("Page.captureScreenshot", Json.MAPPER.createObjectNode().put("format", "png"));
            call("Emulation.clearDeviceMetricsOverride", null);
            return Base64.getDecoder().decode(r.path("data").asText());
        }

        /** @return the current page printed to PDF with its print style sheet on paper of the given size (inches) */
        byte[] printToPdf(double widthIn, double heightIn) throws InterruptedException {
            JsonNode r = call("Page.printToPDF", Json.MAPPER.createObjectNode().put("paperWidth", widthIn)
                    .put("paperHeight", heightIn).put("printBackground", false).put("displayHeaderFooter", false));
            return Base64.getDecoder().decode(r.path("data").asText());
        }

        @Override
        public void close() throws InterruptedException {
            socket.abort();
            proc.destroy();
            if (!proc.waitFor(10, TimeUnit.SECONDS)) {
                proc.destroyForcibly();
                proc.waitFor(10, TimeUnit.SECONDS);
            }
            deleteTree(profile);
        }
    }

    private static void deleteTree(Path root) {
        try (java.util.stream.Stream<Path> walk = Files.walk(root)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException | java.io.UncheckedIOException ignored) {
            // best effort: a temporary browser profile
        }
    }

    /** @return true on the page's load event */
    private static boolean handle(JsonNode e, List<String> errors, List<String> requests) {
        String method = e.path("method").asText();
        JsonNode p = e.path("params");
        switch (method) {
            case "Runtime.consoleAPICalled" -> {
                String type = p.path("type").asText();
                if (type.equals("error") || type.equals("assert")) {
                    errors.add("console." + type + ": " + p.path("args").toString());
                }
            }
            case "Runtime.exceptionThrown" -> errors.add("exception: " + p.path("exceptionDetails").toString());
            case "Log.entryAdded" -> {
                if (p.path("entry").path("level").asText().equals("error")) {
                    errors.add("log: " + p.path("entry").path("text").asText());
                }
            }
            case "Network.requestWillBeSent" -> requests.add(p.path("request").path("url").asText());
            case "Network.loadingFailed" -> errors.add("loading failed: " + p.toString());
            case "Page.loadEventFired" -> {
                return true;
            }
            default -> { }
        }
        return false;
    }

    private static int port(Process proc) throws IOException {
        BufferedReader r = new BufferedReader(new InputStreamReader(proc.getInputStream(), StandardCharsets.UTF_8));
        Pattern p = Pattern.compile("DevTools listening on ws://[^:]+:(\\d+)/");
        CompletableFuture<Integer> found = CompletableFuture.supplyAsync(() -> {
            try {
                String line;
                while ((line = r.readLine()) != null) {
                    Matcher m = p.matcher(line);
                    if (m.find()) {
                        return Integer.parseInt(m.group(1));
                    }
                }
            } catch (IOException e) {
                return -1;
            }
            return -1;
        });
        try {
            int port = found.get(30, TimeUnit.SECONDS);
            Assertions.assertTrue(port > 0, "chromium did not report a DevTools port");
            // keep draining the browser's output so it never blocks on a full pipe
            CompletableFuture.runAsync(() -> {
                try {
                    while (r.readLine() != null) {
                        // discard
                    }
                } catch (IOException ignored) {
                    // the browser was closed
                }
            });
            return port;
        } catch (Exception e) {
            throw new IOException("chromium did not start its DevTools endpoint", e);
        }
    }

    /** Collects DevTools messages (which may arrive in several text frames) as JSON. */
    private static final class Collector implements WebSocket.Listener {
        private final LinkedBlockingQueue<JsonNode> events;
        private final StringBuilder partial = new StringBuilder();

        Collector(LinkedBlockingQueue<JsonNode> events) {
            this.events = events;
        }

        @Override
        public CompletionStage<?> onText(WebSocket webSocket, CharSequence data, boolean last) {
            partial.append(data);
            if (last) {
                try {
                    events.add(Json.MAPPER.readTree(partial.toString()));
                } catch (IOException e) {
                    events.add(Json.MAPPER.createObjectNode().put("method", "parse-error"));
                }
                partial.setLength(0);
            }
            webSocket.request(1);
            return null;
        }
    }
}
