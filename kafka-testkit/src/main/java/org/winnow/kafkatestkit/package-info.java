/**
 * A real single-node KRaft broker for tests, in the test JVM, with a JUnit 5 extension that gives each
 * test class its own broker. Used in test scope only: the broker's jars never reach the shipped jar.
 */
package org.winnow.kafkatestkit;
