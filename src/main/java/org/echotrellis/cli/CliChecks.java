package org.echotrellis.cli;

import java.util.List;
import java.util.Optional;

import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.VolumeJob;

import org.echotrellis.InputException;

/** Validation of command-line option values; messages name the option. */
final class CliChecks {
    private CliChecks() { }

    static double positiveOrInf(String option, double v) {
        if (!(v > 0)) {
            throw new InputException(option + " must be > 0 (or Infinity), got " + v);
        }
        return v;
    }

    static double b1(String option, double v) {
        if (!(v > 0) || v > 5 || Double.isNaN(v)) {
            throw new InputException(option + " must be within (0, 5], got " + v);
        }
        return v;
    }

    static int threads(int n) {
        if (n < 1 || n > 1024) {
            throw new InputException("--threads must be within [1, 1024], got " + n);
        }
        return n;
    }

    /**
     * Builds a volume job; a mask or B1 map on another grid is reported under its option name.
     */
    static VolumeJob volumeJob(NiftiInput in, Optional<NiftiImage> mask, Optional<NiftiImage> b1, int threads) {
        try {
            return new VolumeJob(in, mask, b1, threads, VolumeJob.DEFAULT_SLAB_VALUES);
        } catch (InputException e) {
            String m = e.getMessage();
            if (m.startsWith("mask ")) {
                throw new InputException("--mask " + m.substring(5), e);
            }
            if (m.startsWith("B1 map ")) {
                throw new InputException("--b1-map " + m.substring(7), e);
            }
            throw e;
        }
    }

    /**
     * @param text value of an outside-mask fill option: {@code nan} or a number
     * @return the fill value
     */
    static float outsideMaskValue(String text) {
        String t = text.trim();
        if (t.equalsIgnoreCase("nan")) {
            return Float.NaN;
        }
        try {
            float v = Float.parseFloat(t);
            if (Float.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // refused below
        }
        throw new InputException("--outside-mask-value must be nan or a finite number (e.g. 0), got " + text);
    }

    /**
     * @param t1Ms the value of {@code --t1-ms}, or null when not given
     * @return it, or NaN for "T1 of each protocol's tissue" (the library options' convention)
     */
    static double t1OrProtocol(Double t1Ms) {
        return t1Ms == null ? Double.NaN : t1Ms;
    }

    /** Library keys of the fit and spectrum settings; each is given by the option of the same name. */
    static final String[] FIT_KEYS = {"t1_ms", "t2_min_ms", "t2_max_ms", "t2_bins", "b1_min", "b1_max", "noise_sigma",
        "misfit_increase", "fraction_window_ms", "refocus_search_deg", "refocus_deg", "regularisation"};

    /**
     * Library keys of the settings of a dataset run ({@code bids}, {@code cohort}) that a collection or
     * subject can refuse: the spectrum grid is given there by {@code --spectrum-t2-min-ms} and
     * {@code --spectrum-t2-max-ms}.
     */
    static final String[] DATASET_KEYS = {"t1_ms", "fraction_window_ms", "noise_sigma",
        "t2_min_ms=--spectrum-t2-min-ms", "t2_max_ms=--spectrum-t2-max-ms"};

    /** Builds fit or spectrum settings; see {@link #asOptions(java.util.function.Supplier, String...)} with {@link #FIT_KEYS}. */
    static <T> T asOptions(java.util.function.Supplier<T> build) {
        return asOptions(build, FIT_KEYS);
    }

    /**
     * Runs library code whose input errors name parameters by their library keys ({@code t2_max_ms},
     * {@code objective}) and reports them under the options that give those parameters
     * ({@code --t2-max-ms}, {@code --objective}); see {@link #optionNames(String, String...)}.
     *
     * @param build the library call
     * @param keys the library keys this call's options give
     * @return what the call returns
     */
    static <T> T asOptions(java.util.function.Supplier<T> build, String... keys) {
        try {
            return build.get();
        } catch (InputException e) {
            String m = optionNames(e.getMessage(), keys);
            if (m.equals(e.getMessage())) {
                throw e;
            }
            throw new InputException(m, e);
        }
    }

    /** {@link #asOptions(java.util.function.Supplier, String...)} for a call without a result. */
    static void checkAsOptions(Runnable check, String... keys) {
        asOptions(() -> {
            check.run();
            return null;
        }, keys);
    }

    /**
     * Names options instead of library keys in a message. A key is given by the option of the same
     * words ({@code b1rms_limit_ut}: {@code --b1rms-limit-ut}), or by the option after '=' ({@code
     * key=--option}). A snake_case key is replaced wherever it stands as a word (not inside a path or
     * a longer name); a plain word ({@code objective}, {@code out}) only where it opens the message or
     * stands alone in parentheses, so that the same word in prose stays as it is.
     *
     * @param message a library message
     * @param keys library keys
     * @return the message for the command line
     */
    static String optionNames(String message, String... keys) {
        String m = message == null ? "" : message;
        for (String k : keys) {
            int eq = k.indexOf('=');
            String key = eq < 0 ? k : k.substring(0, eq);
            String option = eq < 0 ? "--" + key.replace('_', '-') : k.substring(eq + 1);
            String word = java.util.regex.Pattern.quote(key);
            String regex = key.indexOf('_') >= 0 ? "(?<![\\w./-])" + word + "(?![\\w-]|\\.\\w)"
                    : "(?:^" + word + "(?![\\w-]|\\.\\w)|(?<=\\()" + word + "(?=\\)))";
            m = m.replaceAll(regex, java.util.regex.Matcher.quoteReplacement(option));
        }
        return m;
    }

    /**
     * Opens an output directory given by {@code --out}.
     *
     * @param dir the directory
     * @param force whether existing files may be replaced
     * @param inputs input files, never written over
     * @return the output set
     */
    static org.echotrellis.io.OutputSet outputSet(java.nio.file.Path dir, boolean force,
            java.util.Collection<java.nio.file.Path> inputs) {
        return asOptions(() -> org.echotrellis.io.OutputSet.open(dir, force, inputs), "out");
    }

    /**
     * The command-line wording of a library input error: a refused overwrite names {@code --force}.
     *
     * @param message a library message
     * @return the message as the command line prints it
     */
    static String forCommandLine(String message) {
        return message == null ? null
                : message.replace(org.echotrellis.io.AtomicFiles.EXISTS, " exists; use --force to overwrite");
    }

    /**
     * @param spec a running command
     * @return the command line as typed, for provenance ({@code echotrellis SUBCOMMAND ARGS}); an
     *         argument with spaces or quotes is quoted
     */
    static String commandLine(picocli.CommandLine.Model.CommandSpec spec) {
        StringBuilder sb = new StringBuilder("echotrellis");
        picocli.CommandLine.ParseResult pr = spec.root().commandLine().getParseResult();
        List<String> args = pr == null ? List.of(spec.qualifiedName()) : pr.originalArgs();
        for (String a : args) {
            boolean quote = a.isEmpty() || a.chars().anyMatch(ch -> Character.isWhitespace(ch) || ch == '\'' || ch == '"');
            sb.append(' ').append(quote ? "'" + a.replace("'", "'\\''") + "'" : a);
        }
        return sb.toString();
    }

    /**
     * The provenance block of a command's JSON outputs: version, command line, SHA-256 of every
     * input file, the protocol text.
     *
     * @param spec the running command
     * @param protocol the protocol file (hashed and its text included), or null
     * @param inputs the other input files (null entries skipped)
     * @return the block
     */
    static java.util.Map<String, Object> provenance(picocli.CommandLine.Model.CommandSpec spec, java.nio.file.Path protocol,
            java.nio.file.Path... inputs) {
        List<java.nio.file.Path> files = new java.util.ArrayList<>();
        files.add(protocol);
        files.addAll(java.util.Arrays.asList(inputs));
        String text = protocol == null ? null : org.echotrellis.sequence.ProtocolText.read(protocol).text();
        return org.echotrellis.io.Provenance.of(commandLine(spec), files, text);
    }

    /**
     * @param json a JSON output as a map
     * @param spec the running command
     * @param protocol its protocol file
     * @return a copy with a {@code provenance} block appended
     */
    static java.util.Map<String, Object> withProvenance(java.util.Map<String, Object> json,
            picocli.CommandLine.Model.CommandSpec spec, java.nio.file.Path protocol) {
        java.util.Map<String, Object> m = new java.util.LinkedHashMap<>(json);
        m.put("provenance", provenance(spec, protocol));
        return m;
    }

    /**
     * The spectrum choices of a command line (null where left to each protocol's defaults), shared by
     * {@code spectrum} and the dataset commands; errors name the options.
     *
     * @param t1Ms {@code --t1-ms}
     * @param windows the {@code --fraction-window-ms} values
     * @param t2MinMs shortest grid T2 in ms (checked by the caller under its option name)
     * @param t2MaxMs longest grid T2 in ms (likewise)
     * @param t2Bins {@code --t2-bins}
     * @param regularisation {@code --regularisation}
     * @param misfitIncrease {@code --misfit-increase}
     * @param refocusSearch {@code --refocus-search-deg}
     * @param refocusDeg {@code --refocus-deg}
     * @return the choices
     */
    static org.echotrellis.fit.spectrum.SpectrumChoices spectrumChoices(Double t1Ms, List<String> windows,
            Double t2MinMs, Double t2MaxMs, Integer t2Bins, String regularisation, Double misfitIncrease,
            String refocusSearch, Double refocusDeg) {
        org.echotrellis.Checks.require(refocusDeg == null || refocusSearch == null,
                "--refocus-deg and --refocus-search-deg exclude each other; give one");
        org.echotrellis.fit.spectrum.RefocusSearch search = asOptions(() -> refocusDeg != null
                ? org.echotrellis.fit.spectrum.RefocusSearch.fixed(refocusDeg)
                : refocusSearch != null ? org.echotrellis.fit.spectrum.RefocusSearch.parse(refocusSearch) : null);
        org.echotrellis.fit.spectrum.Regularisation r =
                asOptions(() -> org.echotrellis.fit.spectrum.Regularisation.parse(regularisation));
        if (misfitIncrease != null && r == org.echotrellis.fit.spectrum.Regularisation.NONE) {
            throw new InputException("--misfit-increase sets the misfit target of regularisation; it has no effect with "
                    + "--regularisation none");
        }
        List<org.echotrellis.fit.spectrum.FractionWindow> ws = new java.util.ArrayList<>();
        for (String w : windows) {
            ws.add(asOptions(() -> org.echotrellis.fit.spectrum.FractionWindow.parse(w)));
        }
        return new org.echotrellis.fit.spectrum.SpectrumChoices(t1Ms != null ? positiveOrInf("--t1-ms", t1Ms) : Double.NaN,
                ws, t2MinMs != null ? t2MinMs : Double.NaN, t2MaxMs != null ? t2MaxMs : Double.NaN,
                t2Bins != null ? org.echotrellis.Checks.inRange("--t2-bins", t2Bins, 2,
                        org.echotrellis.fit.spectrum.T2Grid.MAX_BINS, null) : 0,
                r, misfitIncrease != null ? misfitIncrease : Double.NaN, search);
    }
}
