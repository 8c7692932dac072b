"""Project errors: what they say and that they survive a pickle round trip (worker processes of studies)."""
import pickle

import pytest

from bilayer.core.errors import DesignFileError, InputError, UnitError, UnknownMaterialError


@pytest.mark.parametrize("error", [
    InputError("layers[1].thickness", -1e-3, "a length > 0 m", "negative"),
    UnitError("thickness", "3 kg", "a length", ""),
    UnknownMaterialError("material", "steell", "a library key", "did you mean 'steel_1018'?"),
    DesignFileError("design.toml", "[conditions] stress_free_temperature", "a temperature", "line 4"),
])
def test_errors_survive_pickling_with_their_fields_and_message(error):
    copy = pickle.loads(pickle.dumps(error))
    assert type(copy) is type(error)
    assert (copy.field, copy.value, copy.valid, copy.hint) == (error.field, error.value, error.valid, error.hint)
    assert str(copy) == str(error)


def test_an_input_error_is_also_a_value_error():
    with pytest.raises(ValueError, match="thickness: -1 is not valid; expected a length > 0"):
        raise InputError("thickness", -1, "a length > 0")


def test_a_missing_optional_library_names_the_feature_and_the_extra():
    """(derived here) require() turns an ImportError into one line that says what to install."""
    from bilayer.core.errors import BilayerError, MissingDependencyError, require

    assert require("math", "a test", "none").sqrt(4.0) == 2.0
    with pytest.raises(MissingDependencyError, match=r"bilayer report needs no_such_module_xyz, which is not "
                                                     r"installed: pip install 'bilayer\[report\]'") as caught:
        require("no_such_module_xyz", "bilayer report", "report")
    assert isinstance(caught.value, BilayerError) and isinstance(caught.value, ImportError)
