package org.winnow.app.cli;

import java.io.IOException;
import java.io.PrintWriter;
import picocli.CommandLine.Option;

/** {@code --metrics-port}, shared by scan and the cluster stages, as one picocli mixin. */
public final class MetricsPortOption {
    @Option(names = "--metrics-port", paramLabel = "P",
            description = "Serve Prometheus metrics on http://127.0.0.1:P/metrics (0 picks a free port).")
    public Integer metricsPort;

    /** Refuses a port outside 0..65535, naming it. */
    public void validate() {
        if (metricsPort != null && (metricsPort < 0 || metricsPort > 65535)) {
            throw new IllegalArgumentException("--metrics-port must be in 0..65535, got " + metricsPort);
        }
    }

    /** Opens the process's meters, serving them when a port was given, and says where on {@code err}. */
    public ProcessMetrics open(PrintWriter err, String command) throws IOException {
        ProcessMetrics metrics = ProcessMetrics.open(metricsPort);
        metrics.port().ifPresent(port -> {
            err.println("winnow " + command + ": metrics on http://127.0.0.1:" + port + "/metrics");
            err.flush();
        });
        return metrics;
    }
}
