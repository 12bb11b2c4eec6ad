package org.tectomelt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.Map;
import org.junit.jupiter.api.Test;

class ConfigTest {

    @Test
    void embeddedDefaultsApplyWithAnEmptyEnvironment() {
        assertEquals(Config.defaults(), Config.fromEnvironment(Map.of()));
        assertEquals(7070, Config.defaults().port());
        assertEquals("0.0.0.0", Config.defaults().host());
    }

    @Test
    void environmentOverridesEachSetting() {
        Config c = Config.fromEnvironment(Map.of("PORT", "8081", "HOST", "127.0.0.1",
                "TECTOMELT_MAX_BODY_BYTES", "2048"));
        assertEquals(8081, c.port());
        assertEquals("127.0.0.1", c.host());
        assertEquals(2048, c.maxBodyBytes());
    }

    @Test
    void unusableValuesAreRefusedWithTheVariableNamed() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Config.fromEnvironment(Map.of("PORT", "seventy")));
        assertEquals("PORT must be an integer, got 'seventy'", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Config.fromEnvironment(Map.of("PORT", "70000")));
    }
}
