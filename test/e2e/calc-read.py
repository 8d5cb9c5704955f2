"""Opens a workbook in LibreOffice Calc (headless) through its scripting bridge and prints the
values of the cells asked for, as JSON on standard output.

    python3 calc-read.py PROFILE_DIR WORKBOOK CELL_OR_RANGE...

With CALC_READ_PID_FILE set, the id of the soffice process (and of its process group) is
written there as soon as it starts.

Calc blocks web-query formulas (WEBSERVICE) in a document it has just loaded until links are
allowed ("Err:540" otherwise). A fresh profile in PROFILE_DIR names the workbook's folder a
trusted location, and the document is loaded with full link updating, so the formulas call the
service while the document loads. Used by test/e2e/libreoffice.test.ts; runs with the system
Python that Debian's python3-uno package serves.
"""
import json
import os
import pathlib
import signal
import subprocess
import sys
import time

import uno
from com.sun.star.beans import PropertyValue

FULL_UPDATE = 3  # com.sun.star.document.UpdateDocMode.FULL_UPDATE
CONNECT_SECONDS = 90


def prop(name, value):
    p = PropertyValue()
    p.Name = name
    p.Value = value
    return p


def write_profile(profile, trusted_dir):
    """A user profile that trusts the workbook's folder and always recalculates on load."""
    user = profile / "user"
    user.mkdir(parents=True, exist_ok=True)
    trusted = pathlib.Path(trusted_dir).resolve().as_uri()
    (user / "registrymodifications.xcu").write_text(
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        '<oor:items xmlns:oor="http://openoffice.org/2001/registry" '
        'xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">\n'
        # trusted locations: links in documents from here may update
        '<item oor:path="/org.openoffice.Office.Common/Security/Scripting">'
        '<prop oor:name="SecureURL" oor:op="fuse"><value><it>%s</it></value></prop></item>\n'
        # Calc: update links when opening: always (0)
        '<item oor:path="/org.openoffice.Office.Calc/Content/Update">'
        '<prop oor:name="Link" oor:op="fuse"><value>0</value></prop></item>\n'
        # Calc: recalculate files of this format on load: always (0)
        '<item oor:path="/org.openoffice.Office.Calc/Formula/Load">'
        '<prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>\n'
        "</oor:items>\n" % trusted,
        encoding="utf-8",
    )


def cell_json(cell):
    kind = cell.getType().value  # EMPTY, VALUE, TEXT, FORMULA
    return {"type": kind, "string": cell.getString(), "value": cell.getValue(), "formula": cell.getFormula()}


def main():
    profile = pathlib.Path(sys.argv[1]).resolve()
    workbook = pathlib.Path(sys.argv[2]).resolve()
    wanted = sys.argv[3:]
    write_profile(profile, workbook.parent)
    pipe = "throatline-calc-%d" % os.getpid()
    office = subprocess.Popen(
        [
            "soffice",
            "-env:UserInstallation=" + profile.as_uri(),
            "--headless", "--invisible", "--norestore", "--nologo", "--nodefault", "--nolockcheck",
            "--accept=pipe,name=%s;urp;StarOffice.ComponentContext" % pipe,
        ],
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
        start_new_session=True,  # its own process group, ended as a whole below
    )
    pid_file = os.environ.get("CALC_READ_PID_FILE")
    if pid_file:  # so the caller can end the group if this script itself is killed
        pathlib.Path(pid_file).write_text(str(office.pid))
    desktop = None
    try:
        local = uno.getComponentContext()
        resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
        ctx = None
        deadline = time.monotonic() + CONNECT_SECONDS
        while ctx is None:
            try:
                ctx = resolver.resolve("uno:pipe,name=%s;urp;StarOffice.ComponentContext" % pipe)
            except Exception:
                if office.poll() is not None:
                    raise RuntimeError("soffice exited with code %s before accepting a connection" % office.returncode)
                if time.monotonic() > deadline:
                    raise RuntimeError("soffice did not accept a connection within %d s" % CONNECT_SECONDS)
                time.sleep(0.25)
        desktop = ctx.ServiceManager.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        doc = desktop.loadComponentFromURL(
            workbook.as_uri(), "_blank", 0, (prop("Hidden", True), prop("UpdateDocMode", FULL_UPDATE), prop("ReadOnly", True))
        )
        if doc is None:
            raise RuntimeError("Calc could not open %s" % workbook)
        sheet = doc.Sheets.getByIndex(0)
        out = {"sheet": sheet.getName(), "cells": {}, "arrays": {}}
        for ref in wanted:
            rng = sheet.getCellRangeByName(ref)
            if ":" in ref:
                out["arrays"][ref] = rng.getArrayFormula()
                addr = rng.getRangeAddress()
                for r in range(addr.EndRow - addr.StartRow + 1):
                    for c in range(addr.EndColumn - addr.StartColumn + 1):
                        cell = rng.getCellByPosition(c, r)
                        a = cell.getCellAddress()
                        name = "%s%d" % (chr(ord("A") + a.Column), a.Row + 1)
                        out["cells"][name] = cell_json(cell)
            else:
                out["cells"][ref] = cell_json(rng)
        doc.close(True)
        print(json.dumps(out))
    finally:
        if desktop is not None:
            try:
                desktop.terminate()
            except Exception:
                pass  # the bridge drops as soffice exits
        try:
            office.wait(15)
        except subprocess.TimeoutExpired:
            pass
        try:
            os.killpg(office.pid, signal.SIGKILL)  # whatever of our soffice is left
        except ProcessLookupError:
            pass
        office.wait(5)


if __name__ == "__main__":
    main()
