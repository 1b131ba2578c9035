package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestFactory;

/**
 * The {@code --help} text of every command, compared with the golden copies in
 * {@code src/test/resources/help/}, so that option names, defaults and examples cannot change
 * unnoticed. After an intended change, regenerate them all with
 * {@code mvn -B -o test -Dtest=HelpGoldenTest -Dgolden.update=true} and review the diff.
 */
class HelpGoldenTest {
    private static final Path DIR = Path.of("src/test/resources/help");
    private static final boolean UPDATE = Boolean.getBoolean("golden.update");

    private static List<String> commands() {
        List<String> names = new ArrayList<>();
        names.add("");
        names.addAll(Main.newCommandLine().getSubcommands().keySet());
        return names;
    }

    @TestFactory
    Stream<DynamicTest> helpTextsMatchTheGoldenCopies() {
        return commands().stream().map(name -> DynamicTest.dynamicTest(name.isEmpty() ? "echotrellis" : name, () -> {
            CliRun r = name.isEmpty() ? CliRun.of("--help") : CliRun.of(name, "--help");
            assertEquals(0, r.code(), r.err());
            Path golden = DIR.resolve((name.isEmpty() ? "echotrellis" : name) + ".txt");
            if (UPDATE) {
                Files.createDirectories(DIR);
                Files.writeString(golden, r.out(), StandardCharsets.UTF_8);
                return;
            }
            assertTrue(Files.exists(golden), golden + " is missing; regenerate with "
                    + "mvn -B -o test -Dtest=HelpGoldenTest -Dgolden.update=true");
            assertEquals(Files.readString(golden, StandardCharsets.UTF_8), r.out(),
                    name + " --help differs from " + golden + " (if intended, regenerate with "
                            + "mvn -B -o test -Dtest=HelpGoldenTest -Dgolden.update=true)");
        }));
    }

    /** Every example line in the help texts fits 80 columns, so wrapped lines stay copy-pasteable. */
    @Test
    void examplesFitTheTerminalAndUseTheJar() throws IOException {
        for (String name : commands()) {
            CliRun r = name.isEmpty() ? CliRun.of("--help") : CliRun.of(name, "--help");
            boolean inExamples = false;
            for (String line : r.out().split("\n")) {
                if (line.startsWith("Example")) {
                    inExamples = true;
                } else if (inExamples && line.isBlank()) {
                    inExamples = false;
                } else if (inExamples) {
                    assertTrue(line.length() <= 80, name + ": example line too long: " + line);
                    assertTrue(line.startsWith("  "), name + ": an example wrapped by the help layout: " + line);
                    assertTrue(!line.startsWith("  echotrellis "), name + ": examples run the jar: " + line);
                }
            }
        }
    }

    /** The help texts name only files that exist (shipped examples, or files the demo writes). */
    @Test
    void examplesNameShippedFiles() {
        for (String name : commands()) {
            CliRun r = name.isEmpty() ? CliRun.of("--help") : CliRun.of(name, "--help");
            for (String token : r.out().split("[\\s=]+")) {
                if (token.startsWith("sequences/")) {
                    assertTrue(Files.exists(Path.of(token)), name + " --help names " + token + ", which is not shipped");
                }
            }
        }
    }
}
