package org.echotrellis.cli;

import static org.echotrellis.cli.Adversarial.KNEE;
import static org.echotrellis.cli.Adversarial.refused;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Library messages name parameters by their keys; the command line reports the options that give
 * them (expected wording written out by hand from the option names, common practice).
 */
class OptionNamesTest {
    @TempDir
    Path dir;

    @Test
    void snakeCaseKeysBecomeOptionsWhereverTheyStandAsWords() {
        assertEquals("--t2-max-ms must be > --t2-min-ms, got 1.0 <= 2.0",
                CliChecks.optionNames("t2_max_ms must be > t2_min_ms, got 1.0 <= 2.0", CliChecks.FIT_KEYS));
        assertEquals("at least one --fraction-window-ms is needed",
                CliChecks.optionNames("at least one fraction_window_ms is needed", CliChecks.FIT_KEYS));
        // in a path or a longer name, or an option already, the key stays
        assertEquals("/data/t1_ms/x.csv: my_t1_ms, t1_ms.yaml, --t1-ms",
                CliChecks.optionNames("/data/t1_ms/x.csv: my_t1_ms, t1_ms.yaml, --t1-ms", "t1_ms"));
        // bids and cohort give the spectrum grid by options of other names
        assertEquals("--spectrum-t2-max-ms must be > --spectrum-t2-min-ms (500.0 ms), got 300.0",
                CliChecks.optionNames("t2_max_ms must be > t2_min_ms (500.0 ms), got 300.0", CliChecks.DATASET_KEYS));
    }

    @Test
    void plainWordKeysOnlyWhereTheyOpenTheMessageOrStandInParentheses() {
        assertEquals("--objective signal echo must be within [1, 256], got 0 (--objective)",
                CliChecks.optionNames("objective signal echo must be within [1, 256], got 0 (objective)", "objective"));
        assertEquals("the objective refers to echo 9", CliChecks.optionNames("the objective refers to echo 9", "objective",
                "echo"));
        assertEquals("--echo must be within [1, 16], got 17",
                CliChecks.optionNames("echo must be within [1, 16], got 17", "echo"));
        assertEquals("echoes must be > 0", CliChecks.optionNames("echoes must be > 0", "echo"));
    }

    @Test
    void aRefusedOverwriteNamesForce() {
        assertEquals("o/t2.nii exists; use --force to overwrite",
                CliChecks.forCommandLine("o/t2.nii" + org.echotrellis.io.AtomicFiles.EXISTS));
    }

    @Test
    void fitAndSpectrumSettingsAreReportedUnderTheirOptions() throws IOException {
        Path table = Files.writeString(dir.resolve("t.csv"), table());
        refused(CliRun.of("fit", table.toString(), "--protocol", KNEE, "--t2-min-ms", "50", "--t2-max-ms", "10"), 2,
                "--t2-max-ms must be > --t2-min-ms");
        refused(CliRun.of("fit", table.toString(), "--protocol", KNEE, "--b1-min", "0"), 2, "--b1-min must be");
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--fraction-window-ms", "10"), 2,
                "--fraction-window-ms must be LO:HI in ms, got '10'");
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--refocus-search-deg", "100:90:5"), 2,
                "--refocus-search-deg HI must be within");
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--regularisation", "lasso"), 2,
                "--regularisation must be one of misfit, cross-validation, none; got 'lasso'");
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--t2-bins", "1"), 2,
                "--t2-bins must be within [2, ");
    }

    @Test
    void designImagePathwaysAndSimulateSettingsAreReportedUnderTheirOptions() {
        refused(CliRun.of("design", "--protocol", KNEE, "--objective", "signal:0"), 2,
                "--objective signal echo must be within [1, ");
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "constant:0.4", "--startup", "slow"), 2,
                "--startup slow is not understood; allowed: none, alsop, ramp:N");
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "wave:1"), 2,
                "--target wave:1 is not understood; allowed: ");
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "constant:0.4", "--min-flip-deg", "120",
                "--max-flip-deg", "100"), 2, "--min-flip-deg (120.0) must not exceed --max-flip-deg (100.0)");
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "constant:0.4", "--sar-budget", "2"), 2,
                "--sar-budget must be within (0, 1]");
        refused(CliRun.of("image", KNEE, "--phase-lines", "17"), 2, "--phase-lines 17 must be a multiple of the 16 echoes");
        refused(CliRun.of("pathways", KNEE, "--echo", "17"), 2, "--echo must be within [1, 16], got 17");
        refused(CliRun.of("simulate", KNEE, "--refocusing-flip-deg", "400"), 2,
                "--refocusing-flip-deg must be within (0, 360], got 400.0");
    }

    @Test
    void outputPathsAreReportedUnderTheirOptions() throws IOException {
        Path file = Files.writeString(dir.resolve("plain-file"), "x");
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "constant:0.4", "--out", file.toString()), 2,
                "--out " + file + " exists and is not a directory");
        Path png = Files.writeString(dir.resolve("p.png"), "kept");
        refused(CliRun.of("simulate", KNEE, "--plot", png.toString()), 2, png + " exists; use --force to overwrite");
    }

    private static String table() {
        StringBuilder sb = new StringBuilder("te_ms,a\n");
        for (int k = 1; k <= 16; k++) {
            sb.append(9.0 * k).append(',').append(1000 * Math.exp(-9.0 * k / 40)).append('\n');
        }
        return sb.toString();
    }
}
