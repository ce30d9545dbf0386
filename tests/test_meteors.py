"""Meteor rates: the ZHR formula worked by hand, its limits, and the radiant's drift.

The formula is common practice of visual meteor work (the observers' organisations teach
it so): ZHR = N r^(6.5 - LM) / ((1 - k) T_eff sin(h_R)^gamma), uncertainty ZHR / sqrt(N).
The check values below are worked by hand from it, step by step in the comments.
"""

import math

import pytest

from calcfuncs.cells import evaluate


def test_hand_worked_example():
    # Common practice, worked by hand: 40 meteors in 1.5 h effective, LM 6.0, r = 2.5,
    # radiant at 45 degrees, 10 % of the field under cloud.
    #   r^(6.5 - 6.0) = sqrt(2.5) = 1.5811388;  F = 1 / 0.9 = 1.1111111
    #   sin 45 = 0.7071068;  T_eff sin h = 1.0606602
    #   ZHR = 40 * 1.1111111 * 1.5811388 / 1.0606602 = 66.2539
    #   sigma = 66.2539 / sqrt(40) = 66.2539 / 6.3245553 = 10.4757
    args = [40, 1.5, 6.0, 45.0, 2.5, 0.1]
    assert evaluate("SKY.METEOR.ZHR", args) == pytest.approx(66.2539, abs=1e-3)
    assert evaluate("SKY.METEOR.ZHR.ERROR", args) == pytest.approx(10.4757, abs=1e-3)


@pytest.mark.parametrize("count,hours", [(1, 1.0), (37, 1.0), (120, 2.0), (7, 0.5)])
def test_standard_conditions_give_the_hourly_count(count, hours):
    # The limits of the formula (common practice): radiant at the zenith, limiting
    # magnitude 6.5, no cloud: the ZHR is the hourly count itself, with sqrt(N) / T.
    args = [count, hours, 6.5, 90.0, 2.4]
    assert evaluate("SKY.METEOR.ZHR", args) == pytest.approx(count / hours, rel=1e-14)
    assert evaluate("SKY.METEOR.ZHR.ERROR", args) == pytest.approx(
        math.sqrt(count) / hours, rel=1e-14)


def test_each_correction_on_its_own():
    # One magnitude poorer sky multiplies by r; the radiant at 30 degrees doubles the
    # rate (sin 30 = 1/2); half the field clouded doubles it; gamma 1.5 at 30 degrees
    # gives 2^1.5 (all by the formula's definition).
    base = evaluate("SKY.METEOR.ZHR", [50, 1.0, 6.5, 90.0, 2.2])
    assert evaluate("SKY.METEOR.ZHR", [50, 1.0, 5.5, 90.0, 2.2]) == pytest.approx(base * 2.2)
    assert evaluate("SKY.METEOR.ZHR", [50, 1.0, 6.5, 30.0, 2.2]) == pytest.approx(base * 2.0)
    assert evaluate("SKY.METEOR.ZHR", [50, 1.0, 6.5, 90.0, 2.2, 0.5]) == pytest.approx(base * 2.0)
    assert evaluate("SKY.METEOR.ZHR", [50, 1.0, 6.5, 30.0, 2.2, 0, 1.5]) == pytest.approx(
        base * 2.0 ** 1.5)


@pytest.mark.parametrize("args,mention", [
    ([-3, 1.0, 6.5, 90.0, 2.5], "cannot be negative"),
    ([3.5, 1.0, 6.5, 90.0, 2.5], "whole number"),
    ([3, 0.0, 6.5, 90.0, 2.5], "more than 0 hours"),
    ([3, 1.0, 6.5, -4.0, 2.5], "below the horizon"),
    ([3, 1.0, 6.5, 91.0, 2.5], "cannot exceed 90"),
    ([3, 1.0, 6.5, 50.0, 1.0], "population index"),
    ([3, 1.0, 6.5, 50.0, 2.5, 20], "0.2 for 20 %"),
    ([3, 1.0, 16.5, 50.0, 2.5], "limiting magnitude"),
    ([3, "many", 6.5, 50.0, 2.5], "hours must be a number"),
])
def test_bad_input_is_said_in_the_cell(args, mention):
    got = evaluate("SKY.METEOR.ZHR", args)
    assert got.startswith("#SKY: ") and mention in got, got


def test_no_meteors_has_a_rate_but_no_poisson_error():
    assert evaluate("SKY.METEOR.ZHR", [0, 1.0, 6.0, 40.0, 2.5]) == 0.0
    assert "at least one" in evaluate("SKY.METEOR.ZHR.ERROR", [0, 1.0, 6.0, 40.0, 2.5])


def test_a_column_with_a_bad_row():
    got = evaluate("SKY.METEOR.ZHR", [((10,), (-1,), (20,)), 1.0, 6.5, 90.0, 2.5])
    assert got[0][0] == 10.0 and got[2][0] == 20.0 and got[1][0].startswith("#SKY: ")


def test_radiant_drift():
    # The linear drift of shower lists (common practice): 10.1471 days between solar
    # longitudes 5 degrees apart (5 / (360 / 365.2422)); 1 degree a day in RA and -0.4 in
    # Dec move the radiant by that many days' worth.
    days = 5.0 * 365.2422 / 360.0
    ra = evaluate("SKY.METEOR.RADIANT.RA", [152.0, 22.0, 235.0, 240.0, 1.0, -0.4])
    dec = evaluate("SKY.METEOR.RADIANT.DEC", [152.0, 22.0, 235.0, 240.0, 1.0, -0.4])
    assert ra == pytest.approx(152.0 + days, abs=1e-9)
    assert dec == pytest.approx(22.0 - 0.4 * days, abs=1e-9)
    # Across solar longitude 0 (the Quadrantids' season) and across RA 0.
    assert evaluate("SKY.METEOR.RADIANT.RA", [359.0, 50.0, 358.0, 2.0, 0.5, 0.0]) == \
        pytest.approx((359.0 + 0.5 * 4.0 * 365.2422 / 360.0) % 360.0, abs=1e-9)
    assert "past a pole" in evaluate("SKY.METEOR.RADIANT.DEC", [10.0, 85.0, 0.0, 40.0, 0.0, 1.0])
