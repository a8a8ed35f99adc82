package dev.tend.cli;

public final class TendMain {
    public static void main(String[] args) {
    }
}
