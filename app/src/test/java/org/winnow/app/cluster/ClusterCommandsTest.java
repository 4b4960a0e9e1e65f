package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.WinnowCli;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import picocli.CommandLine;

/** The cluster commands refuse bad input with exit code 2 and one line on stderr naming it. */
@KafkaBroker
@Timeout(120)
class ClusterCommandsTest {
    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    ClusterCommandsTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    record Run(int exit, String out, String err) {
    }

    private static Run winnow(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    @Test
    void aWrongBootstrapAddressIsRefusedInOneLine() throws Exception {
        int closed;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            closed = s.getLocalPort();
        }
        Path input = Files.writeString(dir.resolve("in.txt"), "4:5\n");
        Run r = winnow("produce", "--kafka", "127.0.0.1:" + closed, "--run", "r1", "--input", input.toString());
        assertEquals(2, r.exit());
        assertEquals("winnow produce: no Kafka broker answered at 127.0.0.1:" + closed + " within 5 s",
                r.err().strip());
    }

    @Test
    void aRunThatDoesNotExistIsRefusedNamingItsTopics() throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        Run score = winnow("score", "--kafka", broker.bootstrapServers(), "--run", "nobody", "--model",
                model.toString(), "--keep", "h11=1..3");
        assertEquals(2, score.exit(), score.err());
        assertTrue(score.err().startsWith("winnow score: run 'nobody' has no topics")
                && score.err().contains("winnow.nobody.scored"), score.err());
        assertEquals(1, score.err().strip().lines().count());
        Run sink = winnow("sink", "--kafka", broker.bootstrapServers(), "--run", "nobody", "--out",
                dir.resolve("out").toString());
        assertEquals(2, sink.exit(), sink.err());
        assertTrue(sink.err().startsWith("winnow sink: run 'nobody' has no topics"), sink.err());
    }

    @Test
    void watchRefusesARunThatDoesNotExistAndABadMetricsPortIsRefused() throws Exception {
        Run watch = winnow("watch", "--kafka", broker.bootstrapServers(), "--run", "nobody", "--once");
        assertEquals(2, watch.exit(), watch.err());
        assertTrue(watch.err().startsWith("winnow watch: run 'nobody' has no topics"), watch.err());
        assertEquals(1, watch.err().strip().lines().count());
        Run sink = winnow("sink", "--kafka", broker.bootstrapServers(), "--run", "nobody", "--out",
                dir.resolve("out").toString(), "--metrics-port", "70000");
        assertEquals(2, sink.exit(), sink.err());
        assertEquals("winnow sink: --metrics-port must be in 0..65535, got 70000", sink.err().strip());
    }

    @Test
    void aSinkAskedForRejectsOfARunWithSlimRejectsIsRefusedBeforeItWritesAnything() throws Exception {
        Path input = Files.writeString(dir.resolve("in.txt"), "4:5\n2:3/2:3\n");
        Run slim = winnow("produce", "--kafka", broker.bootstrapServers(), "--run", "slim-run", "--input",
                input.toString(), "--partitions", "1");
        assertEquals(0, slim.exit(), slim.err());
        Path out = dir.resolve("rejects-out");
        Run sink = winnow("sink", "--kafka", broker.bootstrapServers(), "--run", "slim-run", "--out", out.toString(),
                "--rejects");
        assertEquals(2, sink.exit(), sink.err());
        assertEquals("winnow sink: run 'slim-run' carries rejected candidates slim, so there are no rejects to"
                + " write; drop --rejects, or create the run with winnow produce --rejects", sink.err().strip());
        assertTrue(!Files.exists(out), "nothing written");
        // The same input again with --rejects is another run's settings, refused by the descriptor.
        Run whole = winnow("produce", "--kafka", broker.bootstrapServers(), "--run", "slim-run", "--input",
                input.toString(), "--partitions", "1", "--rejects");
        assertEquals(2, whole.exit(), whole.err());
        assertTrue(whole.err().contains("rejects: 'slim' vs 'whole'"), whole.err());
    }

    @Test
    void badRunIdsAndMissingFilesAreRefusedBeforeConnecting() {
        Run badId = winnow("sink", "--kafka", broker.bootstrapServers(), "--run", "a.b", "--out", dir.toString());
        assertEquals(2, badId.exit());
        assertTrue(badId.err().contains("'a.b'"), badId.err());
        Run noInput = winnow("produce", "--kafka", broker.bootstrapServers(), "--run", "r2", "--input",
                dir.resolve("missing.txt").toString());
        assertEquals(2, noInput.exit());
        assertTrue(noInput.err().contains("missing.txt") && noInput.err().contains("no such readable file"),
                noInput.err());
        Run badConfig = winnow("produce", "--kafka", broker.bootstrapServers(), "--kafka-config",
                dir.resolve("nope.properties").toString(), "--run", "r2", "--input", dir.toString());
        assertEquals(2, badConfig.exit());
        Run badAddress = winnow("score", "--kafka", "no-port", "--run", "r", "--model", "m.wnm");
        assertEquals(2, badAddress.exit());
        assertTrue(badAddress.err().contains("HOST:PORT"), badAddress.err());
    }
}
