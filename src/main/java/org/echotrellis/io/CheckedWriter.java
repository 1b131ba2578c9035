package org.echotrellis.io;

import java.io.IOException;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;

/**
 * A writer that fails loudly: every write or flush error of the wrapped writer (a full disk, a
 * closed pipe, {@code /dev/full}) is thrown as a {@link WriteFailure} naming the stream, instead
 * of being recorded silently as {@link PrintWriter} does. Wrap it in a {@link PrintWriter} (which
 * passes unchecked exceptions through) to print with checked writes.
 */
public final class CheckedWriter extends Writer {
    private final Writer out;
    private final String name;

    /**
     * @param out the writer to guard
     * @param name the stream's name for messages, e.g. "standard output"
     */
    CheckedWriter(Writer out, String name) {
        this.out = out;
        this.name = name;
    }

    /**
     * A print writer on a byte stream (UTF-8) whose every failed write or flush throws.
     *
     * @param stream the stream, e.g. {@code new FileOutputStream(FileDescriptor.out)}
     * @param name the stream's name for messages
     * @param autoFlush flush on println
     * @return the writer
     */
    public static PrintWriter printWriter(OutputStream stream, String name, boolean autoFlush) {
        return new PrintWriter(new CheckedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8), name), autoFlush);
    }

    @Override
    public void write(char[] cbuf, int off, int len) {
        try {
            out.write(cbuf, off, len);
        } catch (IOException e) {
            throw fail(e);
        }
    }

    @Override
    public void write(String s, int off, int len) {
        try {
            out.write(s, off, len);
        } catch (IOException e) {
            throw fail(e);
        }
    }

    @Override
    public void flush() {
        try {
            out.flush();
        } catch (IOException e) {
            throw fail(e);
        }
    }

    @Override
    public void close() {
        try {
            out.close();
        } catch (IOException e) {
            throw fail(e);
        }
    }

    private WriteFailure fail(IOException e) {
        return WriteFailure.of("cannot write to " + name, e);
    }
}
