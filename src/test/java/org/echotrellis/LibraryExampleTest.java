package org.echotrellis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.lang.reflect.Method;
import java.net.URL;
import java.net.URLClassLoader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import javax.tools.JavaCompiler;
import javax.tools.ToolProvider;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The README's "Use as a library" example, compiled against the project's classes and run as it stands. */
class LibraryExampleTest {
    @TempDir
    Path dir;

    @Test
    void readmeExampleCompilesRunsAndRecoversTheSimulatedT2() throws Exception {
        String readme = Files.readString(Path.of("README.md"));
        Matcher m = Pattern.compile("<!-- library-example:start -->\\s*```java\\n(.*?)```\\s*<!-- library-example:end -->",
                Pattern.DOTALL).matcher(readme);
        assertTrue(m.find(), "README has no library example block");
        Path src = dir.resolve("LibraryExample.java");
        Files.writeString(src, m.group(1));
        JavaCompiler javac = ToolProvider.getSystemJavaCompiler();
        ByteArrayOutputStream diag = new ByteArrayOutputStream();
        int rc = javac.run(null, diag, diag, "-d", dir.toString(), "-cp", System.getProperty("java.class.path"),
                src.toString());
        assertEquals(0, rc, diag.toString(StandardCharsets.UTF_8));
        String out = run(dir);
        // noise-free decays simulated by the engine: the fits return the generating values (round trip)
        Matcher one = Pattern.compile("decay 123: T2 ([0-9.]+) ms \\(true ([0-9.]+)\\)").matcher(out);
        assertTrue(one.find(), out);
        assertEquals(Double.parseDouble(one.group(2)), Double.parseDouble(one.group(1)), 0.2, out);
        Matcher vol = Pattern.compile("voxel 500 T2 ([0-9.]+) ms \\(true ([0-9.]+)\\)").matcher(out);
        assertTrue(vol.find(), out);
        assertEquals(Double.parseDouble(vol.group(2)), Double.parseDouble(vol.group(1)), 0.2, out);
    }

    private static String run(Path classes) throws Exception {
        ByteArrayOutputStream buf = new ByteArrayOutputStream();
        PrintStream old = System.out;
        try (URLClassLoader cl = new URLClassLoader(new URL[] {classes.toUri().toURL()},
                LibraryExampleTest.class.getClassLoader())) {
            Method main = cl.loadClass("LibraryExample").getMethod("main", String[].class);
            System.setOut(new PrintStream(buf, true, StandardCharsets.UTF_8));
            Locale def = Locale.getDefault();
            try {
                Locale.setDefault(Locale.ROOT);
                main.invoke(null, (Object) new String[0]);
            } finally {
                Locale.setDefault(def);
            }
        } finally {
            System.setOut(old);
        }
        return buf.toString(StandardCharsets.UTF_8);
    }
}
