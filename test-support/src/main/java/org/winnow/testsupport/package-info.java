/**
 * Helpers shared by the tests of several modules; test scope only. {@link org.winnow.testsupport.Damage}
 * makes the seeded small edits the fuzz tests of the file readers feed them.
 */
package org.winnow.testsupport;
