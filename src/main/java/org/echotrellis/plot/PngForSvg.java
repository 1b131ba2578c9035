package org.echotrellis.plot;

import java.awt.image.RenderedImage;
import java.io.IOException;
import java.io.OutputStream;
import javax.imageio.ImageIO;
import org.apache.batik.ext.awt.image.spi.ImageWriter;
import org.apache.batik.ext.awt.image.spi.ImageWriterParams;
import org.apache.batik.ext.awt.image.spi.ImageWriterRegistry;

/**
 * Lets Batik's SVG generator embed raster images as base64 PNG through the JDK's own PNG encoder
 * (javax.imageio), so a chart with a raster image becomes a compact SVG without Batik's codec
 * module. Registered once, on first use.
 */
final class PngForSvg implements ImageWriter {
    private static boolean registered;

    private PngForSvg() { }

    /** Registers the writer for image/png unless one is present. */
    static synchronized void register() {
        if (!registered) {
            ImageWriterRegistry reg = ImageWriterRegistry.getInstance();
            if (reg.getWriterFor("image/png") == null) {
                reg.register(new PngForSvg());
            }
            registered = true;
        }
    }

    @Override
    public void writeImage(RenderedImage image, OutputStream out) throws IOException {
        if (!ImageIO.write(image, "png", out)) {
            throw new IOException("no PNG encoder in this Java runtime");
        }
    }

    @Override
    public void writeImage(RenderedImage image, OutputStream out, ImageWriterParams params) throws IOException {
        writeImage(image, out);
    }

    @Override
    public String getMIMEType() {
        return "image/png";
    }
}
