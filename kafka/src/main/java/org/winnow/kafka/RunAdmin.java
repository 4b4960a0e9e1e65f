package org.winnow.kafka;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.DescribeClusterOptions;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.admin.TopicDescription;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.errors.AuthenticationException;
import org.apache.kafka.common.errors.AuthorizationException;
import org.apache.kafka.common.errors.TopicExistsException;

/**
 * Creates a run's topics and checks that a run exists before a stage joins it. Every failure to reach the
 * cluster or find the run is a one-line {@link ClusterRefusedException}.
 */
public final class RunAdmin implements AutoCloseable {
    /** Metric snapshots are for watching, not for keeping: a day is plenty. */
    static final String METRICS_RETENTION_MS = String.valueOf(Duration.ofDays(1).toMillis());

    private final KafkaSettings settings;
    private final Admin admin;

    private RunAdmin(KafkaSettings settings, Admin admin) {
        this.settings = settings;
        this.admin = admin;
    }

    /**
     * Connects and waits up to the settings' connect timeout for the cluster to answer.
     *
     * @throws ClusterRefusedException when no broker answers at the bootstrap address in time, or refuses
     *     the client's credentials
     */
    public static RunAdmin connect(KafkaSettings settings) {
        Objects.requireNonNull(settings, "settings");
        Map<String, Object> p = timeouts(settings);
        Admin admin;
        try {
            admin = Admin.create(p);
        } catch (KafkaException e) {
            throw new ClusterRefusedException("cannot reach Kafka at " + settings.bootstrap() + ": "
                    + rootMessage(e), e);
        }
        int ms = (int) settings.connectTimeout().toMillis();
        try {
            admin.describeCluster(new DescribeClusterOptions().timeoutMs(ms)).nodes().get(ms + 1000L,
                    TimeUnit.MILLISECONDS);
            return new RunAdmin(settings, admin);
        } catch (ExecutionException | TimeoutException e) {
            admin.close(Duration.ZERO);
            throw unreachable(settings, e);
        } catch (InterruptedException e) {
            admin.close(Duration.ZERO);
            Thread.currentThread().interrupt();
            throw new ClusterRefusedException("interrupted while connecting to Kafka at " + settings.bootstrap(), e);
        }
    }

    /** Client properties with the connect timeout applied to every wait, for any client of the run. */
    static Map<String, Object> timeouts(KafkaSettings settings) {
        Map<String, Object> p = new HashMap<>(settings.common());
        int ms = (int) settings.connectTimeout().toMillis();
        p.putIfAbsent("request.timeout.ms", ms);
        p.putIfAbsent("default.api.timeout.ms", ms);
        p.putIfAbsent("socket.connection.setup.timeout.max.ms", ms);
        p.putIfAbsent("socket.connection.setup.timeout.ms", ms);
        return p;
    }

    static ClusterRefusedException unreachable(KafkaSettings settings, Exception e) {
        Throwable cause = e instanceof ExecutionException && e.getCause() != null ? e.getCause() : e;
        if (cause instanceof AuthenticationException) {
            return new ClusterRefusedException("Kafka at " + settings.bootstrap() + " refused the client's"
                    + " credentials: " + rootMessage(cause), cause);
        }
        if (cause instanceof AuthorizationException) {
            return new ClusterRefusedException("Kafka at " + settings.bootstrap() + " denied access: "
                    + rootMessage(cause), cause);
        }
        return new ClusterRefusedException("no Kafka broker answered at " + settings.bootstrap() + " within "
                + describe(settings.connectTimeout()), cause);
    }

    /**
     * Creates every topic of the run that does not exist yet and settles its descriptor: the first
     * descriptor on the topic is the run's, and one that differs from {@code descriptor} is refused.
     * Several producers may call this at once for the same run; all of them agree afterwards.
     *
     * @return the run's descriptor (equal to {@code descriptor})
     */
    public RunDescriptor createRun(RunTopics run, TopicLayout layout, RunDescriptor descriptor) {
        Objects.requireNonNull(layout, "layout");
        if (!run.runId().equals(descriptor.runId())) {
            throw new IllegalArgumentException("descriptor of run '" + descriptor.runId() + "' given for run '"
                    + run.runId() + "'");
        }
        List<NewTopic> topics = new ArrayList<>();
        topics.add(new NewTopic(run.descriptor(), 1, layout.replication())
                .configs(Map.of("cleanup.policy", "delete", "retention.ms", "-1", "retention.bytes", "-1")));
        for (String t : List.of(run.plan(), run.candidates(), run.scored())) {
            topics.add(new NewTopic(t, layout.partitions(), layout.replication()));
        }
        topics.add(new NewTopic(run.metrics(), 1, layout.replication())
                .configs(Map.of("retention.ms", METRICS_RETENTION_MS)));
        var results = admin.createTopics(topics).values();
        for (var entry : results.entrySet()) {
            try {
                entry.getValue().get(settings.connectTimeout().toMillis() * 6, TimeUnit.MILLISECONDS);
            } catch (ExecutionException e) {
                if (!(e.getCause() instanceof TopicExistsException)) {
                    throw new ClusterRefusedException("cannot create topic " + entry.getKey() + " on "
                            + settings.bootstrap() + ": " + rootMessage(e.getCause()), e.getCause());
                }
            } catch (TimeoutException e) {
                throw new ClusterRefusedException("creating topic " + entry.getKey() + " on " + settings.bootstrap()
                        + " timed out", e);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new ClusterRefusedException("interrupted while creating topic " + entry.getKey(), e);
            }
        }
        awaitTopics(run);
        RunDescriptor settled;
        try (RunLedger ledger = new RunLedger(settings, run)) {
            settled = ledger.settle(RunLedger.RUN_KEY, descriptor.toText(), RunDescriptor::parse);
        }
        String diff = settled.firstDifference(descriptor);
        if (diff != null) {
            throw new ClusterRefusedException("run '" + run.runId() + "' already exists with other settings ("
                    + diff + "); pick a new --run id or repeat the run's settings");
        }
        return settled;
    }

    /**
     * The descriptor of an existing run.
     *
     * @throws ClusterRefusedException when any of the run's topics is missing or it has no descriptor
     */
    public RunDescriptor requireRun(RunTopics run) {
        requireTopics(run);
        try (RunLedger ledger = new RunLedger(settings, run)) {
            String text = ledger.first(RunLedger.RUN_KEY);
            if (text == null) {
                throw new ClusterRefusedException("run '" + run.runId() + "' on " + settings.bootstrap()
                        + " has topics but no descriptor: it is still being created, or was not created by winnow");
            }
            return RunDescriptor.parse(text);
        }
    }

    /**
     * Records that {@code run} is scored with the model of SHA-256 {@code modelChecksum}. The first model
     * claimed for a run is its model; a stage with another model is refused.
     */
    public void claimModel(RunTopics run, String modelChecksum) {
        WireHeaders.modelStamp(modelChecksum);
        String mine = modelChecksum.trim().toLowerCase(java.util.Locale.ROOT);
        String theirs = settleClaim(run, RunLedger.MODEL_KEY, mine);
        if (!theirs.equals(mine)) {
            throw new ClusterRefusedException("run '" + run.runId() + "' is scored with model " + abbreviate(theirs)
                    + ", but this model is " + abbreviate(mine) + "; use the run's model or a new --run id");
        }
    }

    /**
     * Records that every stage of {@code run} uses {@code value} for {@code what} (the keep rules, say).
     * The first claim is the run's; a stage that claims another value is refused.
     */
    public void claim(RunTopics run, String what, String value) {
        Objects.requireNonNull(value, "value");
        String theirs = settleClaim(run, "claim." + what, value);
        if (!theirs.equals(value)) {
            throw new ClusterRefusedException("run '" + run.runId() + "' uses other " + what + " ('"
                    + theirs.replace('\n', ';') + "') than this stage ('" + value.replace('\n', ';')
                    + "'); repeat the run's " + what + " or use a new --run id");
        }
    }

    /** The value claimed for {@code what} in {@code run}, or null when no stage has claimed one yet. */
    public String claimed(RunTopics run, String what) {
        try (RunLedger ledger = new RunLedger(settings, run)) {
            return ledger.first("claim." + what);
        }
    }

    private String settleClaim(RunTopics run, String key, String value) {
        try (RunLedger ledger = new RunLedger(settings, run)) {
            return ledger.settle(key, value, s -> s);
        }
    }

    /** The model claimed for {@code run}, or null when no scorer has joined it yet. */
    public String claimedModel(RunTopics run) {
        try (RunLedger ledger = new RunLedger(settings, run)) {
            return ledger.first(RunLedger.MODEL_KEY);
        }
    }

    /** The number of partitions of each of the run's topics. */
    public Map<String, Integer> partitions(RunTopics run) {
        Map<String, TopicDescription> described = describe(run.all());
        Map<String, Integer> counts = new LinkedHashMap<>();
        for (String t : run.all()) {
            counts.put(t, described.get(t).partitions().size());
        }
        return counts;
    }

    /** The underlying admin client, for lag queries; owned by this object. */
    public Admin admin() {
        return admin;
    }

    /** The settings this admin connected with. */
    public KafkaSettings settings() {
        return settings;
    }

    @Override
    public void close() {
        admin.close(settings.connectTimeout());
    }

    /**
     * Waits for topics just created to show in the broker's metadata, which trails the controller's
     * answer to the creation by a moment (longer on a loaded machine).
     */
    private void awaitTopics(RunTopics run) {
        long deadline = System.nanoTime() + settings.connectTimeout().multipliedBy(6).toNanos();
        while (true) {
            try {
                requireTopics(run);
                return;
            } catch (ClusterRefusedException e) {
                if (System.nanoTime() > deadline) {
                    throw e;
                }
            }
            try {
                Thread.sleep(100);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new ClusterRefusedException("interrupted while waiting for the run's topics", e);
            }
        }
    }

    private void requireTopics(RunTopics run) {
        Set<String> existing;
        try {
            existing = admin.listTopics().names().get(settings.connectTimeout().toMillis() * 2,
                    TimeUnit.MILLISECONDS);
        } catch (ExecutionException | TimeoutException e) {
            throw unreachable(settings, e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new ClusterRefusedException("interrupted while listing topics", e);
        }
        Set<String> missing = new TreeSet<>(run.all());
        missing.removeAll(existing);
        if (!missing.isEmpty()) {
            throw new ClusterRefusedException("run '" + run.runId() + "' has no topic" + (missing.size() > 1 ? "s " : " ")
                    + String.join(", ", missing) + " on " + settings.bootstrap()
                    + "; check --run, or create the run first with winnow produce");
        }
    }

    private Map<String, TopicDescription> describe(List<String> topics) {
        try {
            return admin.describeTopics(topics).allTopicNames().get(settings.connectTimeout().toMillis() * 2,
                    TimeUnit.MILLISECONDS);
        } catch (ExecutionException | TimeoutException e) {
            throw unreachable(settings, e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new ClusterRefusedException("interrupted while describing topics", e);
        }
    }

    private static String abbreviate(String checksum) {
        return checksum.length() > 16 ? checksum.substring(0, 16) + "..." : checksum;
    }

    private static String describe(Duration d) {
        long ms = d.toMillis();
        return ms % 1000 == 0 ? (ms / 1000) + " s" : ms + " ms";
    }

    static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        String m = t.getMessage() == null ? t.getClass().getSimpleName() : t.getMessage();
        int nl = m.indexOf('\n');
        return (nl < 0 ? m : m.substring(0, nl)).strip();
    }

}
