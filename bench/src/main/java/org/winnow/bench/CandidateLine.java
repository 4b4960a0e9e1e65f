package org.winnow.bench;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;

/**
 * One line of a bench candidate file: the configuration in the project's text form, a tab, and its
 * exact Euler characteristic. The chi travels with the candidate so that both scorers under test do
 * the same work (parse, features, forward pass, neighbour vote) and neither computes invariants.
 */
record CandidateLine(Configuration config, long chi) {
    /** Parses {@code line}; {@code number} only names the line in errors. */
    static CandidateLine parse(String line, int number) {
        int tab = line.indexOf('\t');
        if (tab < 0) {
            throw new ConfigurationFormatException(number, line.length() + 1, "expected a tab and the chi");
        }
        Configuration c = ConfigurationText.parse(line.substring(0, tab), number);
        long chi;
        try {
            chi = Long.parseLong(line.substring(tab + 1).trim());
        } catch (NumberFormatException e) {
            throw new ConfigurationFormatException(number, tab + 2, "expected the chi as an integer");
        }
        return new CandidateLine(c, chi);
    }

    String format() {
        return ConfigurationText.format(config) + '\t' + chi;
    }
}
