package org.outstage.verify;

/** The outcome of one limit. */
public enum Verdict { PASS, FAIL, NOT_MEASURED }
