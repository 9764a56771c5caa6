"""Shared builders and checks for the tests (columns, cases, result readers, balances): test
files import from here, never from one another."""
