"""The chain's frames are not drawn on a mount they do not describe: while the Chain tab is in view they
are drawn (the chain is being built from the editors), and away from it only beside the mount made from
the chain's product. Driven by clicks on the tab bar, the Mounts list and the panel's buttons."""

from PySide6.QtCore import Qt

from tests.app.test_chain_panel import bracket_and_plate, click


def click_tab(qtbot, window, title):
    bar = window.side_tabs.tabBar()
    index = next(i for i in range(bar.count()) if bar.tabText(i) == title)
    qtbot.mouseClick(bar, Qt.MouseButton.LeftButton, pos=bar.tabRect(index).center())
    qtbot.waitUntil(lambda: window.side_tabs.currentIndex() == index, timeout=2000)


def click_mount(qtbot, window, index):
    mounts = window.mounts.list
    qtbot.mouseClick(mounts.viewport(), Qt.MouseButton.LeftButton,
                     pos=mounts.visualItemRect(mounts.item(index)).center())
    qtbot.waitUntil(lambda: window.model.selected_index == index, timeout=2000)


def chain_labels_shown(window):
    return [lab.text for key, lab in sorted(window.scene.labels.labels.items())
            if key.startswith("chain") and lab.visible]


def test_the_chain_frames_stay_with_the_chain_and_its_product_mount(qtbot, window):
    frames = window.scene.chain_frames
    click_tab(qtbot, window, "Chain")
    bracket_and_plate(qtbot, window.chain_panel)
    assert frames.count == 2 and chain_labels_shown(window) == ["1 bracket", "2 plate = product"]
    click_mount(qtbot, window, 1)                        # still working on the chain: still drawn
    assert frames.count == 2
    click_tab(qtbot, window, "Decode")                   # away from the chain, on a mount it does not describe
    assert frames.count == 0 and chain_labels_shown(window) == []

    click_tab(qtbot, window, "Chain")
    click(qtbot, window.chain_panel.make_mount_button)   # the product becomes a mount, selected
    product_mount = window.model.selected_index
    click_tab(qtbot, window, "Decode")
    assert frames.count == 2 and chain_labels_shown(window) == ["1 bracket", "2 plate = product"]
    click_mount(qtbot, window, 0)                        # another mount: the chain's frames go
    assert frames.count == 0 and chain_labels_shown(window) == []
    click_mount(qtbot, window, product_mount)            # back on the product: they come back
    assert frames.count == 2
