package org.echotrellis.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * Reads a decay table from CSV: a header row of names, then one row per echo. The first column
 * is the echo time in ms (strictly increasing, &gt; 0); every further column is one decay. Commas
 * separate fields; blank lines and lines starting with {@code #} are skipped. Decay values may be
 * NaN or ±Infinity (the fit marks such a decay invalid and goes on); echo times must be finite.
 * Every error names file, line and column.
 */
public final class DecayTableReader {
    private DecayTableReader() { }

    /**
     * @param file CSV file
     * @return the table
     * @throws InputException for a missing file, a short row, a non-numeric value, a non-finite
     *         echo time, or echo times that are not positive and increasing
     */
    public static DecayTable read(Path file) {
        String where = file.toString();
        List<String> lines;
        InputFiles.requireRegular(file, where);
        try (BufferedReader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            lines = r.lines().toList();
        } catch (NoSuchFileException e) {
            throw new InputException(where + ": file not found");
        } catch (java.nio.file.AccessDeniedException e) {
            throw InputFiles.readFailure(where, e);
        } catch (IOException | java.io.UncheckedIOException e) {
            throw new InputException(where + ": cannot read as UTF-8 text (" + e.getMessage() + ")", e);
        }
        String[] header = null;
        int headerLine = 0;
        List<double[]> rows = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i).strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String[] cells = line.split(",", -1);
            if (header == null) {
                header = cells;
                headerLine = i + 1;
                if (header.length < 2) {
                    throw new InputException(where + " line " + headerLine
                            + ": header needs the echo-time column and at least one decay column, got " + header.length + " column(s)");
                }
                continue;
            }
            if (cells.length != header.length) {
                throw new InputException(where + " line " + (i + 1) + ": expected " + header.length + " columns, got " + cells.length);
            }
            double[] row = new double[cells.length];
            for (int c = 0; c < cells.length; c++) {
                row[c] = number(cells[c].strip(), where + " line " + (i + 1) + " column " + (c + 1), c == 0);
            }
            double t = row[0];
            if (!(t > 0)) {
                throw new InputException(where + " line " + (i + 1) + " column 1: echo time must be > 0 ms, got " + t);
            }
            if (!rows.isEmpty() && !(t > rows.get(rows.size() - 1)[0])) {
                throw new InputException(where + " line " + (i + 1) + " column 1: echo times must increase, got " + t
                        + " after " + rows.get(rows.size() - 1)[0]);
            }
            rows.add(row);
        }
        if (header == null || rows.isEmpty()) {
            throw new InputException(where + ": no data rows (expected a header row then one row per echo)");
        }
        int n = rows.size();
        int cols = header.length - 1;
        double[] times = new double[n];
        double[][] decays = new double[cols][n];
        for (int e = 0; e < n; e++) {
            times[e] = rows.get(e)[0];
            for (int c = 0; c < cols; c++) {
                decays[c][e] = rows.get(e)[c + 1];
            }
        }
        List<String> names = new ArrayList<>();
        for (String h : Arrays.copyOfRange(header, 1, header.length)) {
            String name = h.strip();
            names.add(name.isEmpty() ? "decay" + (names.size() + 1) : name);
        }
        return new DecayTable(where, names, times, decays);
    }

    private static double number(String s, String where, boolean mustBeFinite) {
        try {
            double v = Double.parseDouble(s);
            if (mustBeFinite && !Double.isFinite(v)) {
                throw new InputException(where + ": value must be finite, got " + s);
            }
            return v;
        } catch (NumberFormatException e) {
            throw new InputException(where + ": not a number: \"" + s + "\"");
        }
    }
}
