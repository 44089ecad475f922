"""The collector pause around a compile: off inside, back on after, and left as it was found."""

from __future__ import annotations

import gc
import weakref
from collections.abc import Iterator

import pytest

from measureport.collector import collection_paused


@pytest.fixture
def collector_on() -> Iterator[None]:
    was = gc.isenabled()
    gc.enable()
    yield
    if not was:
        gc.disable()


def test_collection_is_off_inside_and_on_after(collector_on: None) -> None:
    with collection_paused():
        assert not gc.isenabled()
    assert gc.isenabled()


def test_an_error_inside_still_turns_collection_back_on(collector_on: None) -> None:
    with pytest.raises(ValueError), collection_paused():
        raise ValueError("inside")
    assert gc.isenabled()


def test_a_collector_that_was_off_stays_off(collector_on: None) -> None:
    gc.disable()
    with collection_paused():
        pass
    assert not gc.isenabled()


def test_a_cycle_made_inside_is_freed_when_the_pause_ends(collector_on: None) -> None:
    class Node:
        pass

    collected: list[str] = []
    with collection_paused():
        node = Node()
        node.self = node  # type: ignore[attr-defined]
        weakref.finalize(node, collected.append, "freed")
        del node
        assert collected == []  # a cycle: only the collector can free it, and it is paused
    assert collected == ["freed"]
