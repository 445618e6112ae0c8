package org.outstage.ui;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import javafx.embed.swing.SwingFXUtils;
import javafx.scene.image.WritableImage;
import javax.imageio.ImageIO;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.CsvExport;
import org.outstage.report.SvgRenderer;

/** Writes a chart as PNG (what is on screen), SVG (the same description through the report's renderer) or CSV. */
final class ChartExport {
    private ChartExport() {}

    /** Writes the chart as {@code png}, {@code svg} or {@code csv}, through a temporary file moved into place. */
    static void export(ChartCanvas c, String kind, Path file) throws IOException {
        ChartSpec spec = c.spec().orElseThrow(() -> new IllegalArgumentException("the chart is empty"));
        Path tmp = file.resolveSibling(file.getFileName() + ".part");
        switch (kind) {
            case "svg" -> Files.writeString(tmp, SvgRenderer.render(spec, (int) Math.max(320, c.getWidth()), (int) Math.max(200, c.getHeight())));
            case "csv" -> Files.writeString(tmp, CsvExport.toCsv(spec));
            case "png" -> {
                WritableImage img = c.snapshot(null, null);
                ImageIO.write(SwingFXUtils.fromFXImage(img, null), "png", tmp.toFile());
            }
            default -> throw new IllegalArgumentException("export kind '" + kind + "' must be png, svg or csv");
        }
        Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING);
    }

    static String safeName(String title) {
        String s = title.replaceAll("[^A-Za-z0-9._-]+", "-").replaceAll("-+", "-").replaceAll("^-|-$", "");
        return s.isEmpty() ? "chart" : s;
    }
}
