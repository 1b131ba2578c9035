package org.echotrellis.io;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileSystemException;
import java.nio.file.NoSuchFileException;

/**
 * The environment refused an output: standard output or error could not be written (full disk,
 * closed pipe), an output file could not be written (permission denied, no space left on
 * device), or another run holds the output directory. The command line ends such a run with one
 * line and exit code 3, distinct from bad input (2) and internal errors (1).
 */
public class WriteFailure extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message one line naming the path and the system's reason */
    WriteFailure(String message) {
        super(message);
    }

    /**
     * @param message one line naming the path and the system's reason
     * @param cause the underlying exception, shown only with {@code --debug}
     */
    WriteFailure(String message, Throwable cause) {
        super(message, cause);
    }

    /**
     * The system's reason for an I/O failure in plain words: "permission denied", "no such file or
     * directory", or the operating system's text such as "No space left on device".
     *
     * @param e the failure
     * @return a short reason without the path
     */
    public static String reason(IOException e) {
        if (e instanceof AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof NoSuchFileException) {
            return "no such file or directory";
        }
        if (e instanceof FileSystemException fse && fse.getReason() != null) {
            return fse.getReason();
        }
        String m = e.getMessage();
        if (m == null || m.isBlank()) {
            return e.getClass().getSimpleName();
        }
        // FileOutputStream reports "path (reason)"
        int open = m.lastIndexOf(" (");
        if (open >= 0 && m.endsWith(")")) {
            String r = m.substring(open + 2, m.length() - 1);
            return r.equalsIgnoreCase("Permission denied") ? "permission denied" : r;
        }
        return m;
    }

    /**
     * @param what what was being written, e.g. {@code "cannot write out/t2_ms.nii.gz"}
     * @param e the failure
     * @return a failure whose message is {@code what: reason}
     */
    public static WriteFailure of(String what, IOException e) {
        return new WriteFailure(what + ": " + reason(e), e);
    }
}
