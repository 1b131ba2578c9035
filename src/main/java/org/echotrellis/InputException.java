package org.echotrellis;

/**
 * Bad user input: a file, option or value that the program refuses. The command line maps it to
 * exit code 2 and prints its message as one line on stderr. The message names the file (with
 * line/column where known) or the key/option, the bad value, and what is allowed.
 */
public class InputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** @param message one line: where, what value, what is allowed */
    public InputException(String message) {
        super(message);
    }

    /**
     * @param message one line: where, what value, what is allowed
     * @param cause underlying exception, shown only with {@code --debug}
     */
    public InputException(String message, Throwable cause) {
        super(message, cause);
    }
}
