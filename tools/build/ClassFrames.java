import java.io.IOException;
import java.io.InputStream;
import java.net.URL;
import java.net.URLClassLoader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Enumeration;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import java.util.zip.ZipOutputStream;
import org.objectweb.asm.ClassReader;
import org.objectweb.asm.ClassVisitor;
import org.objectweb.asm.ClassWriter;
import org.objectweb.asm.Opcodes;

/**
 * Build step (pom.xml, after the shade plugin): gives every class of the application jar that was compiled for a Java
 * older than 6 (picocli and Commons Math ship such classes) stack map frames and the Java 8 class-file version, and
 * changes nothing else in them. The JDK's class-data archive (tools/outstage) cannot hold classes older than Java 6
 * or classes whose verification fell back to the old verifier, so without this step every run loaded and verified
 * some 170 picocli classes and Commons Math's FastMath from the jar: about 35 ms of each `analyze`, and a third of
 * `--version` (docs/performance.md). A class ASM cannot give frames stays as it was, and is counted.
 *
 * <p>Run: {@code java -cp asm.jar tools/build/ClassFrames.java target/outstage-…-all.jar} (rewrites the jar in place,
 * through a temporary file and a rename).
 */
public final class ClassFrames {
    public static void main(String[] args) throws IOException {
        if (args.length != 1) throw new IllegalArgumentException("usage: ClassFrames JAR");
        Path jar = Path.of(args[0]);
        Path tmp = jar.resolveSibling(jar.getFileName() + ".frames.tmp");
        int rewritten = 0, kept = 0;
        try (ZipFile in = new ZipFile(jar.toFile());
             URLClassLoader loader = new URLClassLoader(new URL[] {jar.toUri().toURL()}, null);
             ZipOutputStream out = new ZipOutputStream(Files.newOutputStream(tmp))) {
            Enumeration<? extends ZipEntry> entries = in.entries();
            while (entries.hasMoreElements()) {
                ZipEntry e = entries.nextElement();
                byte[] b;
                try (InputStream s = in.getInputStream(e)) { b = s.readAllBytes(); }
                if (e.getName().endsWith(".class") && b.length > 8 && major(b) < 50) {
                    try {
                        b = withFrames(b, loader);
                        rewritten++;
                    } catch (RuntimeException ex) {
                        kept++;
                    }
                }
                ZipEntry o = new ZipEntry(e.getName());
                o.setTime(e.getTime());
                out.putNextEntry(o);
                out.write(b);
                out.closeEntry();
            }
        } catch (IOException | RuntimeException ex) {
            Files.deleteIfExists(tmp);
            throw ex;
        }
        Files.move(tmp, jar, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        System.out.println("class frames: " + rewritten + " classes older than Java 6 given frames (Java 8 format)"
                + (kept > 0 ? ", " + kept + " kept as they were" : "") + " in " + jar.getFileName());
    }

    private static int major(byte[] b) { return ((b[6] & 0xff) << 8) | (b[7] & 0xff); }

    private static byte[] withFrames(byte[] b, ClassLoader loader) {
        ClassReader r = new ClassReader(b);
        ClassWriter w = new ClassWriter(ClassWriter.COMPUTE_FRAMES) {
            @Override protected ClassLoader getClassLoader() { return loader; }
        };
        r.accept(new ClassVisitor(Opcodes.ASM9, w) {
            @Override public void visit(int version, int access, String name, String signature, String superName, String[] interfaces) {
                super.visit(Opcodes.V1_8, access, name, signature, superName, interfaces);
            }
        }, ClassReader.SKIP_FRAMES);
        return w.toByteArray();
    }

    private ClassFrames() {}
}
