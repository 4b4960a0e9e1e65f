/**
 * The Kafka transport between stages run as separate processes: topic names per run, topic creation,
 * client settings with a pass-through properties file for TLS and SASL, Kryo serdes with explicit
 * registration IDs, and the checks that refuse a stage meeting the wrong broker, missing topics, another
 * run's records or another model.
 *
 * <p>Every refusal is a {@link org.winnow.kafka.ClusterRefusedException} whose message is one
 * line fit for a command's stderr.
 */
package org.winnow.kafka;
