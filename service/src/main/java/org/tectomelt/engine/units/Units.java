package org.tectomelt.engine.units;

/**
 * The one place that converts between the API's geoscience units (°C, GPa, km, wt%, Myr,
 * mW/m², kyr, mm/yr, cm/yr) and the SI units used inside the engine (K, Pa, m, fraction, s,
 * W/m², m/s).
 */
public final class Units {

    /** 0 °C in kelvin. */
    public static final double ZERO_CELSIUS_K = 273.15;
    /** Seconds in a Julian year (365.25 days). */
    public static final double SECONDS_PER_YEAR = 3.15576e7;
    /** Seconds in a million years. */
    public static final double SECONDS_PER_MYR = 3.15576e13;
    /** Seconds in a thousand years. */
    public static final double SECONDS_PER_KYR = 3.15576e10;

    private Units() {
    }

    /** °C → K. */
    public static double celsiusToKelvin(double c) {
        return c + ZERO_CELSIUS_K;
    }

    /** K → °C. */
    public static double kelvinToCelsius(double k) {
        return k - ZERO_CELSIUS_K;
    }

    /** GPa → Pa. */
    public static double gpaToPa(double gpa) {
        return gpa * 1e9;
    }

    /** Pa → GPa. */
    public static double paToGpa(double pa) {
        return pa * 1e-9;
    }

    /** km → m. */
    public static double kmToM(double km) {
        return km * 1e3;
    }

    /** m → km. */
    public static double mToKm(double m) {
        return m * 1e-3;
    }

    /** Myr → s. */
    public static double myrToS(double myr) {
        return myr * SECONDS_PER_MYR;
    }

    /** s → Myr. */
    public static double sToMyr(double s) {
        return s / SECONDS_PER_MYR;
    }

    /** kyr → s. */
    public static double kyrToS(double kyr) {
        return kyr * SECONDS_PER_KYR;
    }

    /** s → kyr. */
    public static double sToKyr(double s) {
        return s / SECONDS_PER_KYR;
    }

    /** yr → s. */
    public static double yrToS(double yr) {
        return yr * SECONDS_PER_YEAR;
    }

    /** A rate per year → the same rate per second (e.g. kg/m/yr → kg/m/s). */
    public static double perYrToPerS(double perYr) {
        return perYr / SECONDS_PER_YEAR;
    }

    /** Volume rate per metre of arc or ridge, m³/s per m (= m²/s) → km³/yr per km. */
    public static double m2PerSToKm3PerYrPerKm(double m2PerS) {
        // × s/yr gives m³/yr per m; × 1e3 m/km gives per km of length; × 1e-9 km³/m³
        return m2PerS * SECONDS_PER_YEAR * 1e-6;
    }

    /** mW/m² → W/m². */
    public static double mwPerM2ToWPerM2(double mw) {
        return mw * 1e-3;
    }

    /** W/m² → mW/m². */
    public static double wPerM2ToMwPerM2(double w) {
        return w * 1e3;
    }

    /** wt% → mass fraction. */
    public static double wtPctToFraction(double wtPct) {
        return wtPct * 1e-2;
    }

    /** mass fraction → wt%. */
    public static double fractionToWtPct(double fraction) {
        return fraction * 1e2;
    }

    /** mm/yr → m/s. */
    public static double mmPerYrToMPerS(double mmPerYr) {
        return mmPerYr * 1e-3 / SECONDS_PER_YEAR;
    }

    /** cm/yr → m/s. */
    public static double cmPerYrToMPerS(double cmPerYr) {
        return cmPerYr * 1e-2 / SECONDS_PER_YEAR;
    }

    /** m/s → mm/yr. */
    public static double mPerSToMmPerYr(double mPerS) {
        return mPerS * SECONDS_PER_YEAR * 1e3;
    }

    /** m³/s → km³/yr. */
    public static double m3PerSToKm3PerYr(double m3PerS) {
        return m3PerS * SECONDS_PER_YEAR * 1e-9;
    }

    /** a rate per Pa (1/Pa) → per cent per GPa. */
    public static double perPaToPercentPerGpa(double perPa) {
        return perPa * 1e9 * 1e2;
    }
}
