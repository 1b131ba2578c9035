package org.echotrellis.cohort;

import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;

import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
import org.echotrellis.InputException;

/**
 * Lists the subject/session units of a BIDS dataset from its directory names ({@code sub-<L>/},
 * {@code sub-<L>/ses-<S>/}) through Hadoop's FileSystem API. What a unit holds (the multi-echo
 * collections and their sidecars) is read by the task on its executor.
 */
final class Units {
    private Units() { }

    /**
     * @param bidsDir the dataset root
     * @param participants labels to keep (without {@code sub-}); empty for all
     * @return the units sorted by subject and session
     * @throws InputException if the root is missing, has no subjects, or a requested label is absent
     */
    static List<SubjectUnit> list(Path bidsDir, List<String> participants) {
        FileSystem fs = Storage.fs(bidsDir);
        List<SubjectUnit> units = new ArrayList<>();
        Set<String> found = new TreeSet<>();
        try {
            for (FileStatus s : sorted(fs.listStatus(bidsDir))) {
                String name = s.getPath().getName();
                if (!s.isDirectory() || !name.startsWith("sub-") || name.length() == 4) {
                    continue;
                }
                String sub = name.substring(4);
                found.add(sub);
                if (!participants.isEmpty() && !participants.contains(sub)) {
                    continue;
                }
                boolean sessions = false;
                for (FileStatus t : sorted(fs.listStatus(s.getPath()))) {
                    String n = t.getPath().getName();
                    if (t.isDirectory() && n.startsWith("ses-") && n.length() > 4) {
                        units.add(new SubjectUnit(sub, n.substring(4)));
                        sessions = true;
                    }
                }
                if (!sessions) {
                    units.add(new SubjectUnit(sub, ""));
                }
            }
        } catch (FileNotFoundException e) {
            throw new InputException("BIDS_DIR " + bidsDir + " does not exist");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + bidsDir + ": " + e.getMessage(), e);
        }
        for (String p : participants) {
            if (!found.contains(p)) {
                throw new InputException("participant label " + p + ": no directory sub-" + p + " in " + bidsDir
                        + " (labels are given without 'sub-'; found " + found + ")");
            }
        }
        if (units.isEmpty()) {
            throw new InputException("BIDS_DIR " + bidsDir + " holds no sub-<label> directories");
        }
        return units;
    }

    private static FileStatus[] sorted(FileStatus[] a) {
        java.util.Arrays.sort(a, (x, y) -> x.getPath().getName().compareTo(y.getPath().getName()));
        return a;
    }
}
