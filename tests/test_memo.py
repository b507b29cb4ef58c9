"""The bounded cache behind parsing, perception, basicity, balance and amounts."""

from chemcheck._memo import Memo


def test_least_recently_used_entry_goes_first():
    m = Memo(2)
    m.put("a", 1)
    m.put("b", 2)
    assert m.get("a") == 1  # a is now the most recent
    m.put("c", 3)
    assert m.get("b") is None and m.get("a") == 1 and m.get("c") == 3
    assert len(m) == 2


def test_results_kept_for_one_atom_order_only():
    m = Memo()
    m.put_for("CCN", [0, 1, 2], "sites")
    assert m.get_for("CCN", [0, 1, 2]) == "sites"
    assert m.get_for("CCN", [2, 1, 0]) is None  # same molecule drawn in another atom order


def test_a_molecule_drawn_in_another_order_gets_its_own_indices():
    import chemcheck

    a = {s.atom_index: s.kind for s in chemcheck.basic_sites("NCCO")}
    b = {s.atom_index: s.kind for s in chemcheck.basic_sites("OCCN")}
    assert a == {0: "primary_amine"} and b == {3: "primary_amine"}
