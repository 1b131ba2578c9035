package org.echotrellis;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;

/**
 * Checks on input files before they are opened: a missing file, a directory, a FIFO, a device
 * (a link to {@code /dev/zero}) or an unreadable file is refused with one line naming the path and
 * the reason, instead of blocking forever on a pipe or reading without end from a device.
 */
public final class InputFiles {
    private InputFiles() { }

    /**
     * Refuses anything but an existing, readable regular file (links to regular files are fine).
     *
     * @param file the input
     * @param where how messages name it, e.g. {@code "--target list: a.txt"} or the path
     * @throws InputException if it is missing, not a regular file, or not readable
     */
    public static void requireRegular(Path file, String where) {
        if (!Files.exists(file)) {
            throw new InputException(where + ": file not found");
        }
        if (Files.isDirectory(file)) {
            throw new InputException(where + ": is a directory, expected a file");
        }
        if (!Files.isRegularFile(file)) {
            throw new InputException(where + ": not a regular file (a pipe, device or socket); give a file");
        }
        if (!Files.isReadable(file)) {
            throw new InputException(where + ": permission denied");
        }
    }

    /**
     * @param where how messages name the file
     * @param e the failure
     * @return an input error with the system's reason ("permission denied", "file not found", ...)
     */
    public static InputException readFailure(String where, IOException e) {
        if (e instanceof AccessDeniedException) {
            return new InputException(where + ": permission denied", e);
        }
        if (e instanceof NoSuchFileException) {
            return new InputException(where + ": file not found", e);
        }
        String reason = e instanceof FileSystemException f && f.getReason() != null ? f.getReason() : e.getMessage();
        return new InputException(where + ": cannot read (" + reason + ")", e);
    }
}
