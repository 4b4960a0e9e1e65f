package org.winnow.sink;

/**
 * Called just before each step of the sink that makes something durable, naming the step. Production
 * uses {@link #NONE}; tests throw from it to simulate a crash at that exact point.
 */
@FunctionalInterface
public interface CrashHook {
    /** Does nothing. */
    CrashHook NONE = step -> {};

    /** One of {@code "append"}, {@code "seal"}, {@code "sync"}, {@code "checkpoint"}, {@code "rename"}, {@code "manifest"}. */
    void before(String step);
}
