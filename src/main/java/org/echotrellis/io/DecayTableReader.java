package org.echotrellis.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * Reads a decay table from CSV (RFC 4180 through {@link Csv}: quoted names may hold commas and
 * quotes): a header row of names, then one row per echo. The first column is the echo time in ms
 * (strictly increasing, &gt; 0, finite); every further column is one decay. Blank lines and lines
 * starting with {@code #} are skipped. A decay value that is {@code NaN}, {@code nan}, {@code inf},
 * {@code -inf} (numpy's spellings, any case), ±{@code Infinity} or an empty cell marks that decay
 * invalid (the fit reports it and goes on) instead of refusing the table. Every error names file,
 * line and column.
 */
public final class DecayTableReader {
    private DecayTableReader() { }

    /**
     * @param file CSV file
     * @return the table
     * @throws InputException for a missing file, malformed CSV, a short row, a non-numeric value, a
     *         non-finite echo time, or echo times that are not positive and increasing
     */
    public static DecayTable read(Path file) {
        String where = file.toString();
        List<Csv.Row> lines;
        InputFiles.requireRegular(file, where);
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            lines = Csv.read(r);
        } catch (NoSuchFileException e) {
            throw new InputException(where + ": file not found");
        } catch (java.nio.file.AccessDeniedException e) {
            throw InputFiles.readFailure(where, e);
        } catch (java.nio.charset.CharacterCodingException | java.io.UncheckedIOException e) {
            throw new InputException(where + ": cannot read as UTF-8 text (" + e.getMessage() + ")", e);
        } catch (IOException e) {
            throw new InputException(where + ": not valid CSV (" + e.getMessage().split("\\R")[0] + ")", e);
        }
        List<String> header = null;
        int headerLine = 0;
        List<double[]> rows = new ArrayList<>();
        for (Csv.Row line : lines) {
            List<String> cells = line.cells();
            if (cells.stream().allMatch(c -> c.isBlank())) {
                continue;
            }
            if (header == null) {
                header = cells;
                headerLine = line.line();
                if (header.size() < 2) {
                    throw new InputException(where + " line " + headerLine
                            + ": header needs the echo-time column and at least one decay column, got " + header.size() + " column(s)");
                }
                continue;
            }
            int at = line.line();
            if (cells.size() != header.size()) {
                throw new InputException(where + " line " + at + ": expected " + header.size() + " columns, got " + cells.size());
            }
            double[] row = new double[cells.size()];
            for (int c = 0; c < cells.size(); c++) {
                row[c] = number(cells.get(c).strip(), where + " line " + at + " column " + (c + 1), c == 0);
            }
            double t = row[0];
            if (!(t > 0)) {
                throw new InputException(where + " line " + at + " column 1: echo time must be > 0 ms, got " + t);
            }
            if (!rows.isEmpty() && !(t > rows.get(rows.size() - 1)[0])) {
                throw new InputException(where + " line " + at + " column 1: echo times must increase, got " + t
                        + " after " + rows.get(rows.size() - 1)[0]);
            }
            rows.add(row);
        }
        if (header == null || rows.isEmpty()) {
            throw new InputException(where + ": no data rows (expected a header row then one row per echo)");
        }
        int n = rows.size();
        int cols = header.size() - 1;
        double[] times = new double[n];
        double[][] decays = new double[cols][n];
        for (int e = 0; e < n; e++) {
            times[e] = rows.get(e)[0];
            for (int c = 0; c < cols; c++) {
                decays[c][e] = rows.get(e)[c + 1];
            }
        }
        List<String> names = new ArrayList<>();
        for (String h : header.subList(1, header.size())) {
            String name = h.strip();
            names.add(name.isEmpty() ? "decay" + (names.size() + 1) : name);
        }
        return new DecayTable(where, names, times, decays);
    }

    /** Numbers, plus the spellings of missing and infinite values that mark a decay invalid. */
    private static double number(String s, String where, boolean mustBeFinite) {
        double v;
        switch (s.toLowerCase(java.util.Locale.ROOT)) {
            case "":
            case "nan":
            case "+nan":
            case "-nan":
                v = Double.NaN;
                break;
            case "inf":
            case "+inf":
            case "infinity":
            case "+infinity":
                v = Double.POSITIVE_INFINITY;
                break;
            case "-inf":
            case "-infinity":
                v = Double.NEGATIVE_INFINITY;
                break;
            default:
                try {
                    v = Double.parseDouble(s);
                } catch (NumberFormatException e) {
                    throw new InputException(where + ": not a number: \"" + s + "\"");
                }
        }
        if (mustBeFinite && !Double.isFinite(v)) {
            throw new InputException(where + ": echo time must be a finite number, got \"" + s + "\"");
        }
        return v;
    }
}
