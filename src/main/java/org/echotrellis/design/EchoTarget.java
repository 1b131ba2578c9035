package org.echotrellis.design;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * A prescribed echo-amplitude evolution (M0 = 1) for the echo-by-echo inversion. Parsed from the
 * {@code --target} option: {@code constant:LEVEL}, {@code ramp:FIRST:LAST} (linear in echo
 * index), {@code decay:PSEUDO_T2_MS[:START]} (START·exp(−(n−1)·ESP/PSEUDO_T2); START defaults to
 * the first echo of the ideal 180° train) or {@code list:FILE} (one amplitude per echo,
 * separated by white space, commas or new lines; {@code #} starts a comment).
 */
public sealed interface EchoTarget {

    /**
     * @param problem the train the target is for
     * @return one amplitude per echo (a new array)
     */
    double[] amplitudes(DesignProblem problem);

    /** @return the specification in option syntax, for reports */
    String spec();

    /**
     * The same level at every echo.
     *
     * @param level amplitude in [0, 1]
     */
    record Constant(double level) implements EchoTarget {
        /**
         * Validates the level.
         *
         * @param level amplitude in [0, 1]
         */
        public Constant {
            checkLevel("constant level", level);
        }

        @Override
        public double[] amplitudes(DesignProblem problem) {
            double[] out = new double[problem.echoes()];
            java.util.Arrays.fill(out, level);
            return out;
        }

        @Override
        public String spec() {
            return "constant:" + level;
        }
    }

    /**
     * A straight line from the first to the last echo.
     *
     * @param first echo 1
     * @param last echo N
     */
    record Ramp(double first, double last) implements EchoTarget {
        /**
         * Validates both ends.
         *
         * @param first echo 1
         * @param last echo N
         */
        public Ramp {
            checkLevel("ramp start", first);
            checkLevel("ramp end", last);
        }

        @Override
        public double[] amplitudes(DesignProblem problem) {
            int n = problem.echoes();
            double[] out = new double[n];
            for (int i = 0; i < n; i++) {
                out[i] = n == 1 ? first : first + (last - first) * i / (n - 1.0);
            }
            return out;
        }

        @Override
        public String spec() {
            return "ramp:" + first + ":" + last;
        }
    }

    /**
     * An exponential with a chosen pseudo-T2.
     * @param pseudoT2Ms decay constant in ms
     * @param start amplitude at echo 1, or NaN for the ideal 180° first echo of the design tissue
     */
    record Decay(double pseudoT2Ms, double start) implements EchoTarget {
        /**
         * Validates the decay constant and start.
         *
         * @param pseudoT2Ms decay constant in ms
         * @param start amplitude at echo 1, or NaN for the ideal 180° first echo of the design tissue
         * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
         */
        public Decay {
            Checks.positiveOrInfinite("target decay pseudo-T2 (ms)", pseudoT2Ms, null);
            if (!Double.isNaN(start)) {
                checkLevel("decay start", start);
            }
        }

        @Override
        public double[] amplitudes(DesignProblem problem) {
            double s0 = Double.isNaN(start) ? problem.idealEchoes()[0] : start;
            double[] out = new double[problem.echoes()];
            for (int i = 0; i < out.length; i++) {
                out[i] = s0 * Math.exp(-i * problem.echoSpacingMs() / pseudoT2Ms);
            }
            return out;
        }

        @Override
        public String spec() {
            return "decay:" + pseudoT2Ms + (Double.isNaN(start) ? "" : ":" + start);
        }
    }

    /**
     * Explicit amplitudes, one per echo.
     *
     * @param values amplitudes
     * @param source file name
     */
    record Listed(double[] values, String source) implements EchoTarget {
        /**
         * Copies and validates the values.
         *
         * @param values amplitudes
         * @param source file name
         */
        public Listed {
            values = values.clone();
            for (int i = 0; i < values.length; i++) {
                checkLevel("target value " + (i + 1) + " in " + source, values[i]);
            }
        }

        /** @return the target amplitude of every echo, in [0, 1] (a copy) */
        @Override
        public double[] values() {
            return values.clone();
        }

        @Override
        public double[] amplitudes(DesignProblem problem) {
            Checks.require(values.length == problem.echoes(), "target list " + source + " has "
                    + values.length + " values but the train has " + problem.echoes() + " echoes");
            return values.clone();
        }

        @Override
        public String spec() {
            return "list:" + source;
        }
    }

    /**
     * Parses the {@code --target} option.
     *
     * @param spec option value
     * @return the target
     * @throws InputException naming the option, the value and the allowed forms
     */
    static EchoTarget parse(String spec) {
        String s = spec == null ? "" : spec.trim();
        String[] p = s.split(":", -1);
        String allowed = "allowed: constant:LEVEL, ramp:FIRST:LAST, decay:PSEUDO_T2_MS[:START], list:FILE";
        try {
            switch (p[0]) {
                case "constant":
                    Checks.require(p.length == 2, "target " + spec + ": " + allowed);
                    return new Constant(Double.parseDouble(p[1]));
                case "ramp":
                    Checks.require(p.length == 3, "target " + spec + ": " + allowed);
                    return new Ramp(Double.parseDouble(p[1]), Double.parseDouble(p[2]));
                case "decay":
                    Checks.require(p.length == 2 || p.length == 3, "target " + spec + ": " + allowed);
                    return new Decay(Double.parseDouble(p[1]), p.length == 3 ? Double.parseDouble(p[2]) : Double.NaN);
                case "list":
                    Checks.require(p.length >= 2 && !s.substring(5).isBlank(), "target " + spec + ": " + allowed);
                    return readList(Path.of(s.substring(5)));
                default:
                    throw new InputException("target " + spec + " is not understood; " + allowed);
            }
        } catch (NumberFormatException e) {
            throw new InputException("target " + spec + " has a value that is not a number; " + allowed);
        }
    }

    private static Listed readList(Path file) {
        List<String> lines;
        InputFiles.requireRegular(file, "target list:" + file);
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw InputFiles.readFailure("target list:" + file, e);
        }
        List<Double> values = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int hash = line.indexOf('#');
            if (hash >= 0) {
                line = line.substring(0, hash);
            }
            for (String tok : line.trim().split("[\\s,;]+")) {
                if (tok.isEmpty()) {
                    continue;
                }
                try {
                    values.add(Double.parseDouble(tok));
                } catch (NumberFormatException e) {
                    throw new InputException(file + " line " + (i + 1) + ": '" + tok + "' is not a number");
                }
            }
        }
        Checks.require(!values.isEmpty(), "target list: " + file + " holds no values");
        double[] v = new double[values.size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = values.get(i);
        }
        return new Listed(v, file.toString());
    }

    private static void checkLevel(String what, double level) {
        Checks.inRange(what + " (echo amplitude relative to M0)", level, 0, 1, "target");
    }
}
