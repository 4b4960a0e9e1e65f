package org.winnow.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class ConfigurationTextTest {
    /** winnow's own tab-separated files start with a "config" header; read as input it is skipped, not refused. */
    @Test
    void theHeaderOfATabSeparatedFileIsNoConfigurationButOtherTextStaysBad() {
        assertEquals(null, ConfigurationText.stripComment("config\tchi\th11"));
        assertEquals(null, ConfigurationText.stripComment(ConfigurationText.BYTE_ORDER_MARK + "config\th11\th21"));
        assertEquals(null, ConfigurationText.stripComment("  # a comment\t4:5"));
        assertEquals("4:5", ConfigurationText.stripComment("4:5\t-200\t1"));
        // Without a tab it is no header: the word is a bad line the reader reports.
        assertEquals("config", ConfigurationText.stripComment("config"));
        assertEquals("configs", ConfigurationText.stripComment("configs\tx"));
    }

    @Test
    void parsesAndWritesBackTheExamplesOfTheFormat() {
        for (String text : new String[] {"4:5", "2:3/2:3", "3:3,0,1/3:0,3,1", "2:3,0/2:0,3/1:1,1"}) {
            assertEquals(text, Configuration.parse(text).toText());
        }
    }

    @Test
    void blanksAroundSeparatorsAreAllowed() {
        assertEquals("2:3,0/2:0,3/1:1,1", Configuration.parse(" 2 : 3 , 0 / 2:0,3 /1:1, 1 ").toText());
    }

    @Test
    void emptyInputIsNamed() {
        ConfigurationFormatException e = assertThrows(ConfigurationFormatException.class, () -> Configuration.parse("  "));
        assertTrue(e.getMessage().contains("empty input"), e.getMessage());
    }

    @Test
    void badTokenNamesLineAndColumn() {
        ConfigurationFormatException e = assertThrows(ConfigurationFormatException.class,
                () -> ConfigurationText.parse("4:5,x", 7));
        assertEquals(7, e.line());
        assertEquals(5, e.column());
        assertTrue(e.getMessage().contains("expected a degree"), e.getMessage());
    }

    @Test
    void raggedRowsAreNamed() {
        ConfigurationFormatException e = assertThrows(ConfigurationFormatException.class,
                () -> Configuration.parse("2:3,0/2:3"));
        assertTrue(e.getMessage().contains("ragged rows"), e.getMessage());
    }

    @Test
    void negativeEntryIsNamed() {
        ConfigurationFormatException e = assertThrows(ConfigurationFormatException.class,
                () -> Configuration.parse("4:6,-1"));
        assertTrue(e.getMessage().contains("negative entry -1 in row 1, column 2"), e.getMessage());
    }

    @Test
    void tooLargeIsNamed() {
        StringBuilder sb = new StringBuilder("1:2");
        for (int i = 0; i < Configuration.MAX_ROWS; i++) {
            sb.append("/1:2");
        }
        ConfigurationFormatException e = assertThrows(ConfigurationFormatException.class,
                () -> Configuration.parse(sb.toString()));
        assertTrue(e.getMessage().contains("too large"), e.getMessage());
    }

    @Test
    void validatorNamesTheNonCalabiYauRowAndZeroColumnAndDimension() {
        assertEquals("not Calabi-Yau: row 2 (P^2) has degree sum 2, expected 3",
                ConfigurationValidator.problemForCalabiYau(Configuration.parse("2:3/2:2")).orElseThrow());
        assertTrue(ConfigurationValidator.problemForCalabiYau(Configuration.parse("4:5,0")).orElseThrow()
                .startsWith("zero column 2"));
        assertTrue(ConfigurationValidator.problemForCalabiYau(Configuration.parse("1:2")).orElseThrow()
                .startsWith("dimension out of range"));
        assertTrue(ConfigurationValidator.problemForCalabiYau(Configuration.parse("4:5")).isEmpty());
    }
}
